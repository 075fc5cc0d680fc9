/// <reference types="node" />
/*
 * Node-only: splits a spectrum grid across worker threads so a multi-core backend uses every core.
 * Each worker builds its own plan for a contiguous slice of the wavelengths and writes its results
 * straight into SharedArrayBuffer-backed output arrays, so nothing is copied back.
 *
 * Exported from the `@quietglass/shared/node/parallel` subpath, never from the browser-safe index.
 */
import type { Worker } from 'node:worker_threads';
import {
  createSpectrumPlan,
  type SpectralGrid,
  type SpectrumOptions,
  type SpectrumOutput,
  type SpectrumPlan,
} from '../optics/batch.js';
import { elementAt } from '../checked.js';
import { OpticsInputError } from '../optics/errors.js';
import { startWorkers, type StartWorkersOptions } from './worker-start.js';
import type { OpticalStack } from '../optics/stack.js';
import type { SliceJob, SliceReply } from './spectrum-worker.js';

/** Pool size and worker script location. */
export type WorkerPoolOptions = StartWorkersOptions;

/** Result of a parallel computation: the output arrays (over SharedArrayBuffers) and the plan's notes. */
export interface ParallelSpectrum extends SpectrumOutput {
  /** The validated plan for the whole grid (its indexing applies to the arrays). */
  plan: SpectrumPlan;
}

interface Pending {
  remaining: number;
  failed: boolean;
  resolve: () => void;
  reject: (error: Error) => void;
}

/** A fixed set of worker threads computing spectra; reuse one pool for many calls. */
export class SpectrumWorkerPool {
  private readonly workers: Worker[];
  private readonly pending = new Map<number, Pending>();
  private nextJob = 1;
  private closed = false;

  private constructor(workers: Worker[]) {
    this.workers = workers;
    for (const worker of workers) {
      worker.on('message', (reply: SliceReply) => this.onReply(reply));
      worker.on('error', (error) => this.failAll(error));
      worker.on('exit', (code) => {
        if (!this.closed)
          this.failAll(new Error(`a spectrum worker stopped unexpectedly (exit code ${code})`));
      });
    }
  }

  /** Starts the workers and waits until every one is ready. */
  static async create(options: WorkerPoolOptions = {}): Promise<SpectrumWorkerPool> {
    return new SpectrumWorkerPool(await startWorkers('spectrum-worker.js', 'spectrum worker', options));
  }

  /** Number of worker threads. */
  get size(): number {
    return this.workers.length;
  }

  /**
   * Computes the grid like calculateSpectrum, split by wavelength across the workers. Inputs are
   * validated here first, so bad input rejects with the same OpticsInputError as in one thread.
   */
  async compute(
    stack: OpticalStack,
    grid: SpectralGrid,
    options: SpectrumOptions = {},
  ): Promise<ParallelSpectrum> {
    if (this.closed) throw new Error('the worker pool is closed');
    const plan = createSpectrumPlan(stack, grid, options);
    const shared = (length: number) => new Float64Array(new SharedArrayBuffer(length * 8));
    const out: ParallelSpectrum = {
      R: shared(plan.size),
      T: shared(plan.size),
      A: shared(plan.size),
      r: plan.amplitudes ? shared(2 * plan.size) : null,
      t: plan.amplitudes ? shared(2 * plan.size) : null,
      plan,
    };
    const nW = plan.wavelengthsNm.length;
    const slices = Math.min(this.workers.length, nW);
    const id = this.nextJob++;
    const done = new Promise<void>((resolve, reject) => {
      this.pending.set(id, { remaining: slices, failed: false, resolve, reject });
    });
    for (let s = 0; s < slices; s++) {
      const start = Math.floor((s * nW) / slices);
      const end = Math.floor(((s + 1) * nW) / slices);
      const job: SliceJob = {
        id,
        stack: plan.stack,
        wavelengthsNm: Array.from(plan.wavelengthsNm.subarray(start, end)),
        anglesDeg: Array.from(plan.anglesDeg),
        polarisations: [...plan.polarisations],
        options: { back: plan.back, amplitudes: plan.amplitudes },
        wavelengthOffset: start,
        totalWavelengths: nW,
        R: out.R.buffer as SharedArrayBuffer,
        T: out.T.buffer as SharedArrayBuffer,
        A: out.A.buffer as SharedArrayBuffer,
        r: out.r ? (out.r.buffer as SharedArrayBuffer) : null,
        t: out.t ? (out.t.buffer as SharedArrayBuffer) : null,
      };
      elementAt(this.workers, s, 'the worker pool').postMessage(job);
    }
    await done;
    return out;
  }

  /** Stops the workers; pending computations reject. */
  async close(): Promise<void> {
    this.closed = true;
    this.failAll(new Error('the worker pool was closed'));
    await Promise.all(this.workers.map((worker) => worker.terminate()));
  }

  private onReply(reply: SliceReply): void {
    const job = this.pending.get(reply.id);
    if (!job) return;
    if (!reply.ok) {
      this.pending.delete(reply.id);
      job.reject(
        reply.field !== undefined
          ? new OpticsInputError(reply.field, reply.message)
          : new Error(reply.message),
      );
      return;
    }
    job.remaining--;
    if (job.remaining === 0) {
      this.pending.delete(reply.id);
      job.resolve();
    }
  }

  private failAll(error: Error): void {
    for (const [id, job] of this.pending) {
      this.pending.delete(id);
      job.reject(error);
    }
  }
}

/** One-off convenience: starts a pool, computes, and stops it again. */
export async function computeSpectrumParallel(
  stack: OpticalStack,
  grid: SpectralGrid,
  options: SpectrumOptions = {},
  pool: WorkerPoolOptions = {},
): Promise<ParallelSpectrum> {
  const workers = await SpectrumWorkerPool.create(pool);
  try {
    return await workers.compute(stack, grid, options);
  } finally {
    await workers.close();
  }
}
