/// <reference types="node" />
/*
 * Node-only: starting a fixed number of worker threads for the engine's pools and waiting until
 * each has said it is ready.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { OpticsInputError } from '../optics/errors.js';

export interface StartWorkersOptions {
  /** Number of worker threads (default: os.availableParallelism()). */
  size?: number;
  /** Location of the worker script; by default `script` beside this module. */
  workerUrl?: URL;
}

/**
 * Starts `size` workers running `script` (a file name such as `spectrum-worker.js`, beside this
 * module) and resolves once every one has posted `{ ready: true }`. `what` names the worker in
 * errors, e.g. "spectrum worker".
 */
export async function startWorkers(
  script: string,
  what: string,
  options: StartWorkersOptions = {},
): Promise<Worker[]> {
  const size = options.size ?? availableParallelism();
  if (!Number.isInteger(size) || size < 1) throw new OpticsInputError('size', 'must be a whole number ≥ 1');
  const workers = Array.from({ length: size }, () => startWorker(script, options.workerUrl));
  try {
    await Promise.all(
      workers.map(
        (worker) =>
          new Promise<void>((resolve, reject) => {
            worker.once('message', (message: unknown) => {
              if (typeof message === 'object' && message !== null && 'ready' in message) resolve();
              else reject(new Error(`the ${what} answered before it was ready`));
            });
            worker.once('error', reject);
          }),
      ),
    );
  } catch (error) {
    await Promise.all(workers.map((worker) => worker.terminate()));
    throw error;
  }
  return workers;
}

/**
 * Starts one worker. From compiled code (dist) it runs the `.js` script beside this module; when
 * this module itself runs from TypeScript source (tests), the worker loads the `.ts` source through
 * tsx's loader.
 */
function startWorker(script: string, workerUrl: URL | undefined): Worker {
  if (workerUrl) return new Worker(workerUrl);
  const here = import.meta.url;
  if (!here.endsWith('.ts')) return new Worker(new URL(`./${script}`, here));
  const source = new URL(`./${script.replace(/\.js$/, '.ts')}`, here).href;
  const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(source)}); })`;
  return new Worker(bootstrap, { eval: true });
}
