import { Worker } from 'node:worker_threads';
import type { DiagnosisInput, FitInput, GrowInput, ProgressMessage } from '../calculations/optimise-jobs.js';

type Message = ProgressMessage | { type: 'done'; result: unknown } | { type: 'error'; message: string };

/**
 * Runs a fit, grow or diagnosis in a worker thread. `onProgress` may resolve to false to cancel:
 * the thread is ended and the promise rejects with "cancelled".
 */
export function runInThread(
  input: FitInput | GrowInput | DiagnosisInput,
  onProgress: (p: ProgressMessage) => Promise<boolean>,
): Promise<unknown> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./optimise-thread.js', import.meta.url), { workerData: input });
    let settled = false;
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      fn();
    };
    // Progress reports are handled one after another, and the result only after all of them, so
    // the streamed history is complete and in order before the job completes.
    let chain = Promise.resolve();
    worker.on('message', (m: Message) => {
      chain = chain.then(async () => {
        if (settled) return;
        if (m.type === 'done') finish(() => resolve(m.result));
        else if (m.type === 'error') finish(() => reject(new Error(m.message)));
        else if (!(await onProgress(m))) {
          finish(() => reject(new Error('cancelled')));
          await worker.terminate();
        }
      });
    });
    worker.on('error', (err) => finish(() => reject(err)));
    // 'exit' can arrive before the thread's last messages have been handled: allow them a moment.
    worker.on('exit', (code) => {
      setTimeout(() => {
        void chain.then(() => finish(() => reject(new Error(`optimisation thread stopped (exit ${code})`))));
      }, 1000);
    });
  });
}
