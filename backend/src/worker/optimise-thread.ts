/*
 * Worker-thread entry: runs one optimisation job off the worker's main thread, so the BullMQ lock
 * keeps being renewed and the job can be cancelled by ending the thread.
 */
import { parentPort, workerData } from 'node:worker_threads';
import {
  runOptimiseJob,
  type DiagnosisInput,
  type FitInput,
  type GrowInput,
} from '../calculations/optimise-jobs.js';

const port = parentPort;
if (!port) throw new Error('optimise-thread must run in a worker thread');
try {
  const result = runOptimiseJob(workerData as FitInput | GrowInput | DiagnosisInput, (progress) => {
    port.postMessage(progress);
    return true;
  });
  port.postMessage({ type: 'done', result });
} catch (err) {
  port.postMessage({ type: 'error', message: err instanceof Error ? err.message : String(err) });
}
