/// <reference types="node" />
/*
 * Node-only: runs a Yield forecast on every core. The trials are cut into chunks that idle worker
 * threads take one after another (the first trials, which also run the per-layer sensitivity, cost
 * more, so a fixed split would leave a thread waiting). Every trial draws the same random numbers
 * wherever it runs, and mergeYieldParts combines the chunks in trial order, so the forecast equals
 * forecastYield's in one thread exactly.
 *
 * Exported from the `@quietglass/shared/node/yield-parallel` subpath, never from the browser-safe index.
 */
import type { Worker } from 'node:worker_threads';
import { OpticsInputError } from '../optics/errors.js';
import { startWorkers, type StartWorkersOptions } from './worker-start.js';
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import {
  mergeYieldParts,
  prepareYield,
  type YieldForecast,
  type YieldJob,
  type YieldOptions,
  type YieldPart,
} from '../optimise/yield.js';
import type { YieldChunk, YieldChunkReply } from './yield-worker.js';

/** Pool size and worker script location. */
export type YieldPoolOptions = StartWorkersOptions;

/** A fixed set of worker threads running Yield forecasts; forecasts run one after another. */
export class YieldWorkerPool {
  private readonly workers: Worker[];
  private nextId = 1;
  private closed = false;
  private queue: Promise<unknown> = Promise.resolve();

  private broken: Error | null = null;

  private constructor(workers: Worker[]) {
    this.workers = workers;
    // A worker that fails between forecasts leaves the pool unusable; later calls reject.
    for (const worker of workers) {
      worker.on('error', (error) => (this.broken ??= error));
      worker.on('exit', (code) => {
        if (!this.closed)
          this.broken ??= new Error(`a yield worker stopped unexpectedly (exit code ${code})`);
      });
    }
  }

  /** Starts the workers and waits until every one is ready. */
  static async create(options: YieldPoolOptions = {}): Promise<YieldWorkerPool> {
    return new YieldWorkerPool(await startWorkers('yield-worker.js', 'yield worker', options));
  }

  /** Number of worker threads. */
  get size(): number {
    return this.workers.length;
  }

  /**
   * Runs the forecast like forecastYield (same options, same result) across the workers. Inputs
   * are validated here first, so bad input rejects with the same OpticsInputError. `onProgress`
   * is called in this thread as chunks finish; returning false stops handing out chunks, and the
   * result covers the trials finished from the first one on without a gap.
   */
  forecast(stack: OpticalStack, mask: SpecMask, options: YieldOptions = {}): Promise<YieldForecast> {
    if (this.closed) return Promise.reject(new Error('the worker pool is closed'));
    if (this.broken) return Promise.reject(this.broken);
    let job: YieldJob;
    try {
      job = prepareYield(stack, mask, options);
    } catch (error) {
      return Promise.reject(error instanceof Error ? error : new Error(String(error)));
    }
    const run = this.queue.then(() => this.run(job, options.onProgress));
    this.queue = run.catch(() => undefined);
    return run;
  }

  /** Stops the workers. */
  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.workers.map((worker) => worker.terminate()));
  }

  private run(job: YieldJob, onProgress: YieldOptions['onProgress']): Promise<YieldForecast> {
    const id = this.nextId++;
    const chunk = Math.max(25, Math.ceil(job.trials / (this.workers.length * 16)));
    const parts: YieldPart[] = [];
    let nextFrom = 0;
    let done = 0;
    let busy = 0;
    let stopped = false;
    let settled = false;
    let failure: Error | undefined;

    return new Promise<YieldForecast>((resolve, reject) => {
      const detach: (() => void)[] = [];
      const settle = () => {
        if (settled) return;
        settled = true;
        for (const off of detach) off();
        if (failure) {
          reject(failure);
          return;
        }
        try {
          resolve(mergeYieldParts(job, contiguousFromStart(parts)));
        } catch (error) {
          reject(error instanceof Error ? error : new Error(String(error)));
        }
      };
      const dispatch = (worker: Worker): boolean => {
        if (stopped || nextFrom >= job.trials) return false;
        const message: YieldChunk = { id, job, from: nextFrom, to: Math.min(job.trials, nextFrom + chunk) };
        nextFrom = message.to;
        busy++;
        worker.postMessage(message);
        return true;
      };
      for (const worker of this.workers) {
        const onMessage = (reply: YieldChunkReply) => {
          if (reply.id !== id) return;
          busy--;
          if (reply.ok) {
            parts.push(reply.part);
            done += reply.part.to - reply.part.from;
            try {
              if (!stopped && onProgress?.(done / job.trials) === false) stopped = true;
            } catch (error) {
              stopped = true;
              failure ??= error instanceof Error ? error : new Error(String(error));
            }
          } else {
            stopped = true;
            failure ??=
              reply.field !== undefined
                ? new OpticsInputError(reply.field, reply.message)
                : new Error(reply.message);
          }
          if (!dispatch(worker) && busy === 0) settle();
        };
        // A crashed worker never answers its chunk: fail the forecast at once.
        const onError = (error: Error) => {
          stopped = true;
          failure ??= error;
          settle();
        };
        const onExit = (code: number) =>
          onError(new Error(`a yield worker stopped unexpectedly (exit code ${code})`));
        worker.on('message', onMessage);
        worker.on('error', onError);
        worker.on('exit', onExit);
        detach.push(() => {
          worker.off('message', onMessage);
          worker.off('error', onError);
          worker.off('exit', onExit);
        });
      }
      for (const worker of this.workers) dispatch(worker);
    });
  }
}

/** The parts that cover trials 0, 1, … without a gap (all of them unless the run was stopped). */
function contiguousFromStart(parts: readonly YieldPart[]): YieldPart[] {
  const sorted = [...parts].sort((a, b) => a.from - b.from);
  const out: YieldPart[] = [];
  let next = 0;
  for (const part of sorted) {
    if (part.from !== next) break;
    out.push(part);
    next = part.to;
  }
  return out;
}

/** One-off convenience: starts a pool, runs the forecast, and stops the pool again. */
export async function forecastYieldParallel(
  stack: OpticalStack,
  mask: SpecMask,
  options: YieldOptions = {},
  pool: YieldPoolOptions = {},
): Promise<YieldForecast> {
  const workers = await YieldWorkerPool.create(pool);
  try {
    return await workers.forecast(stack, mask, options);
  } finally {
    await workers.close();
  }
}
