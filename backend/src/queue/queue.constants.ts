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

/**
 * How compute jobs are queued: a job that meets a database or Redis outage goes back to the queue
 * and is tried again after 2, 4, 8, 16 and 32 s (about a minute in all); any other failure is final.
 */
export const COMPUTE_JOB_OPTIONS = {
  attempts: 6,
  backoff: { type: 'exponential', delay: 2000 },
  removeOnComplete: { age: 3600 },
  removeOnFail: { age: 86_400 },
} as const;

/** Longest wait for Redis to take a job before the API answers 503. */
export const QUEUE_ADD_TIMEOUT_MS = 5000;
