/* Worker-thread entry of computeDesignedOffThread: computes one report's designed values. */
import { parentPort, workerData } from 'node:worker_threads';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { computeDesigned, type DesignedInput } from './report-compute.js';

try {
  parentPort?.postMessage({ ok: true, output: computeDesigned(workerData as DesignedInput) });
} catch (err) {
  const message =
    err instanceof OpticsInputError ? err.message : err instanceof Error ? err.message : String(err);
  parentPort?.postMessage({ ok: false, message });
}
