import { getPriority, setPriority } from 'node:os';

/** Niceness of the worker process unless QG_WORKER_NICE says otherwise (0 = like the API). */
export const DEFAULT_WORKER_NICE = 10;

/**
 * Gives the worker a lower CPU priority than the API and the database, so a long calculation
 * that keeps every core busy never makes a light request wait for the CPU. Called before the
 * worker starts any thread: on Linux the niceness belongs to a thread, and the compute threads
 * started later inherit it. A niceness can only be raised without privileges; a value the process
 * may not take is left as it is. Returns the niceness in effect.
 */
export function lowerWorkerPriority(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.QG_WORKER_NICE;
  const wanted = raw === undefined || raw === '' ? DEFAULT_WORKER_NICE : Number(raw);
  if (!Number.isInteger(wanted) || wanted < 0 || wanted > 19) {
    throw new Error(`QG_WORKER_NICE must be a whole number from 0 to 19 (got "${raw}")`);
  }
  if (wanted > getPriority()) {
    try {
      setPriority(wanted);
    } catch {
      // Not permitted here (e.g. a sandbox): keep the inherited priority.
    }
  }
  return getPriority();
}
