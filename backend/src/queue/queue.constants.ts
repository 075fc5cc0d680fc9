/** Queue for housekeeping jobs (worker liveness). Calculation queues arrive with the compute queue. */
export const SYSTEM_QUEUE = 'system';

/** Job name the worker answers with its identity, so the API can tell a worker is alive. */
export const PING_JOB = 'ping';

export interface PingResult {
  workerPid: number;
  host: string;
  answeredAt: string;
}
/** Queue of heavy calculations (full analysis; optimisation and Monte Carlo later). */
export const COMPUTE_QUEUE = 'compute';
export const ANALYSIS_JOB = 'analysis';

export interface ComputeJobData {
  calculationId: number;
}
