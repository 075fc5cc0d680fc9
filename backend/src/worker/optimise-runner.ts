import { Worker } from 'node:worker_threads';
import type { DiagnosisInput, FitInput, GrowInput, ProgressMessage } from '../calculations/optimise-jobs.js';

type Message = ProgressMessage | { type: 'done'; result: unknown } | { type: 'error'; message: string };

/** Heap of one optimisation thread, MB (QG_THREAD_MEMORY_MB): a runaway job fails, the worker stays. */
const threadMemoryMb = (() => {
  const v = Number(process.env.QG_THREAD_MEMORY_MB);
  return Number.isInteger(v) && v >= 64 ? v : 1024;
})();

/**
 * Runs a fit, grow or diagnosis in a worker thread. `onProgress` may resolve to false to cancel;
 * so may `signal`, at any time: the thread is ended at once (even inside an iteration) and the
 * promise rejects with "cancelled". A failing progress handler fails the run instead of leaving a
 * rejected promise behind.
 */
export function runInThread(
  input: FitInput | GrowInput | DiagnosisInput,
  onProgress: (p: ProgressMessage) => Promise<boolean>,
  signal?: AbortSignal,
): Promise<unknown> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./optimise-thread.js', import.meta.url), {
      workerData: input,
      resourceLimits: { maxOldGenerationSizeMb: threadMemoryMb },
    });
    let settled = false;
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      fn();
    };
    const onAbort = () => {
      finish(() => reject(new Error('cancelled')));
      void worker.terminate();
    };
    if (signal?.aborted) return onAbort();
    signal?.addEventListener('abort', onAbort);
    // Progress reports are handled one after another, and the result only after all of them, so
    // the streamed history is complete and in order before the job completes.
    let chain = Promise.resolve();
    worker.on('message', (m: Message) => {
      chain = chain
        .then(async () => {
          if (settled) return;
          if (m.type === 'done') finish(() => resolve(m.result));
          else if (m.type === 'error') finish(() => reject(new Error(m.message)));
          else if (!(await onProgress(m))) {
            finish(() => reject(new Error('cancelled')));
            await worker.terminate();
          }
        })
        .catch((err: unknown) => {
          finish(() => reject(err instanceof Error ? err : new Error(String(err))));
          void worker.terminate();
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
