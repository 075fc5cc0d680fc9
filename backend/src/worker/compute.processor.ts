import os from 'node:os';
import { Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { OnWorkerEvent, Processor, WorkerHost } from '@nestjs/bullmq';
import { UnrecoverableError, type Job } from 'bullmq';
import { SpectrumWorkerPool } from '@quietglass/shared/node/parallel';
import type { AnalysisInput, AnalysisSummary } from '@quietglass/shared/analysis';
import { YieldWorkerPool } from '@quietglass/shared/node/yield-parallel';
import { parseStack } from '@quietglass/shared/optics/stack';
import { AnalysisCancelled, runAnalysis } from '../calculations/analysis-runner.js';
import { CalculationStore } from '../calculations/calculation-store.js';
import { withLogFields } from '../common/log-context.js';
import type { OptimiseInput, ProgressMessage, YieldInput } from '../calculations/optimise-jobs.js';
import { runInThread } from './optimise-runner.js';
import { isOutage } from '../common/outage.js';
import { ANALYSIS_JOB, COMPUTE_QUEUE, type ComputeJobData } from '../queue/queue.constants.js';

const envMs = (name: string, fallback: number) => {
  const v = Number(process.env[name]);
  return Number.isInteger(v) && v > 0 ? v : fallback;
};

/**
 * Runs compute-queue jobs. One job at a time per process, using every core through worker
 * threads. A worker that dies mid-job loses its lock; BullMQ's stalled-job check hands the job to
 * another worker, and the database write of the result happens at most once.
 *
 * A database or Redis outage never ends the process: progress writes that fail are skipped, the
 * final write is retried with backoff, and a job that still cannot finish is handed back to the
 * queue (its attempts and backoff are set when it is queued). Any other failure marks the
 * calculation failed with its message and is not retried. Cancellation is watched by a poll of the
 * calculation's status every QG_CANCEL_POLL_MS (250 ms), independent of the job's own progress.
 */
@Processor(COMPUTE_QUEUE, {
  concurrency: 1,
  lockDuration: envMs('QG_JOB_LOCK_MS', 30_000),
  stalledInterval: envMs('QG_STALLED_INTERVAL_MS', 30_000),
  maxStalledCount: 2,
})
export class ComputeProcessor extends WorkerHost implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Compute');
  /** Started once; BullMQ may hand over a job before onModuleInit has finished, so jobs await it too. */
  private pool: Promise<SpectrumWorkerPool> | null = null;
  private readonly me = `${os.hostname()}:${process.pid}`;

  constructor(private readonly store: CalculationStore) {
    super();
  }

  async onModuleInit(): Promise<void> {
    await this.threads();
  }

  async onModuleDestroy(): Promise<void> {
    await (await this.pool)?.close();
    await (await this.yieldPool)?.close();
  }

  private threads(): Promise<SpectrumWorkerPool> {
    if (!this.pool) {
      const size = envMs('QG_COMPUTE_THREADS', os.availableParallelism());
      this.pool = SpectrumWorkerPool.create({ size }).then((pool) => {
        this.logger.log(`${this.me} computing with ${size} thread(s)`);
        return pool;
      });
    }
    return this.pool;
  }

  private yieldPool: Promise<YieldWorkerPool> | null = null;

  /** Every log line written while a job runs names the job and its calculation. */
  process(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    return withLogFields({ jobId: job.id, calculationId: job.data.calculationId }, () => this.run(job));
  }

  private async run(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    const id = job.data.calculationId;
    try {
      if (job.name === ANALYSIS_JOB) return await this.analysis(job);
      if (['fit', 'grow', 'diagnosis', 'yield'].includes(job.name)) return await this.optimisation(job);
      throw new UnrecoverableError(`Unknown compute job "${job.name}"`);
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      if (isOutage(err)) {
        // Back to the queue: a later attempt claims the calculation again.
        this.logger.warn(
          `calculation ${id}: ${message}; handing the job back to the queue (attempt ${job.attemptsMade + 1})`,
        );
        throw err;
      }
      if (err instanceof UnrecoverableError) throw err;
      await this.fail(id, message).catch((e: unknown) => this.logger.warn(`calculation ${id}: ${String(e)}`));
      throw new UnrecoverableError(message);
    }
  }

  /** BullMQ reports Redis connection trouble here; it reconnects by itself. */
  @OnWorkerEvent('error')
  onWorkerError(err: Error): void {
    this.logger.warn(`queue connection: ${err.message}`);
  }

  /** Runs a database write, retrying through an outage of up to about a minute. */
  private async persist<T>(what: string, write: () => Promise<T>): Promise<T> {
    for (let attempt = 0; ; attempt++) {
      try {
        return await write();
      } catch (err) {
        if (!isOutage(err) || attempt >= 6) throw err;
        const delay = Math.min(16_000, 500 * 2 ** attempt);
        this.logger.warn(`${what}: ${(err as Error).message}; trying again in ${delay} ms`);
        await new Promise((r) => setTimeout(r, delay));
      }
    }
  }

  /**
   * Polls the calculation's status; the signal aborts once it is no longer running (cancelled).
   * An outage is not a cancellation: the poll just tries again.
   */
  private watchCancel(id: number): { signal: AbortSignal; stop: () => void } {
    const controller = new AbortController();
    let busy = false;
    const timer = setInterval(
      () => {
        if (busy || controller.signal.aborted) return;
        busy = true;
        this.store
          .isRunning(id)
          .then((running) => {
            if (!running) controller.abort();
          })
          .catch(() => undefined)
          .finally(() => (busy = false));
      },
      envMs('QG_CANCEL_POLL_MS', 250),
    );
    return { signal: controller.signal, stop: () => clearInterval(timer) };
  }

  /**
   * Fit to mask, Grow layers, Run diagnosis (in a worker thread) and Yield forecast (across the
   * yield thread pool): merit per iteration is streamed into `live`, cancellation is watched all
   * along, and the result is stored at most once.
   */
  private async optimisation(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    const id = job.data.calculationId;
    const rows = await this.claim(id);
    if (!rows) return { calculationId: id, outcome: 'skipped' };
    const input = rows.input as OptimiseInput;
    const started = performance.now();
    const watch = this.watchCancel(id);
    let result: unknown;
    try {
      if (input.kind === 'yield') {
        result = await this.forecast(id, job, input, watch.signal);
      } else {
        result = await runInThread(
          input,
          async (p: ProgressMessage) => {
            await job.updateProgress(Math.round(p.fraction * 100)).catch(() => undefined);
            const point = {
              merit: p.merit ?? NaN,
              ...(p.iteration !== undefined ? { iteration: p.iteration } : {}),
              ...(p.layerCount !== undefined ? { layerCount: p.layerCount } : {}),
            };
            await this.store.progressWithPoint(id, p.fraction, point);
            return !watch.signal.aborted;
          },
          watch.signal,
        );
      }
    } catch (err) {
      if (err instanceof Error && err.message === 'cancelled')
        return { calculationId: id, outcome: 'cancelled' };
      throw err;
    } finally {
      watch.stop();
    }
    if (result === null) return { calculationId: id, outcome: 'cancelled' };
    const computeMs = performance.now() - started;
    await this.persist(`storing calculation ${id}`, () =>
      this.store.complete(id, result, computeMs, this.me),
    );
    return { calculationId: id, outcome: 'completed' };
  }

  /** Yield forecast on the thread pool; returns null when cancelled. */
  private async forecast(id: number, job: Job<ComputeJobData>, input: YieldInput, signal: AbortSignal) {
    this.yieldPool ??= YieldWorkerPool.create({
      size: envMs('QG_COMPUTE_THREADS', os.availableParallelism()),
    });
    const pool = await this.yieldPool;
    // A chunk of trials can run for seconds: on cancel the threads are ended mid-chunk and a
    // fresh pool is started for the next job.
    const stopThreads = () => {
      this.yieldPool = null;
      this.stopPool(id, pool);
    };
    signal.addEventListener('abort', stopThreads, { once: true });
    // Cancelled while the pool was starting: the listener above will never fire.
    if (signal.aborted) {
      signal.removeEventListener('abort', stopThreads);
      stopThreads();
      return null;
    }
    try {
      const result = await pool.forecast(
        parseStack(input.stack),
        { bands: input.bands },
        {
          ...input.options,
          layerMaterials: input.layerMaterials,
          back: input.back,
          onProgress: (fraction) => {
            // Fire and forget, but never a rejection left unhandled.
            job.updateProgress(Math.round(fraction * 100)).catch(() => undefined);
            this.store
              .progress(id, fraction)
              .catch((err: unknown) => this.logger.warn(`calculation ${id} progress: ${String(err)}`));
            return !signal.aborted;
          },
        },
      );
      return result.stoppedBy === 'cancelled' || signal.aborted ? null : result;
    } catch (err) {
      if (signal.aborted) return null;
      throw err;
    } finally {
      signal.removeEventListener('abort', stopThreads);
    }
  }

  /** Ends a pool's threads (cancel) and logs how long they took to stop. */
  private stopPool(id: number, pool: { close(): Promise<void> }): void {
    const started = performance.now();
    pool
      .close()
      .then(() =>
        this.logger.log(
          `calculation ${id} cancelled: its threads stopped ${Math.round(performance.now() - started)} ms after the cancel was seen`,
        ),
      )
      .catch((err: unknown) => this.logger.warn(`calculation ${id}: stopping threads: ${String(err)}`));
  }

  private claim(id: number): Promise<{ input: unknown } | null> {
    return this.store.claim(id, this.me);
  }

  private async fail(id: number, message: string): Promise<void> {
    await this.persist(`marking calculation ${id} failed`, () => this.store.fail(id, message));
    this.logger.warn(`calculation ${id} failed: ${message}`);
  }

  private async analysis(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    const id = job.data.calculationId;
    // Claim the calculation; a cancelled or finished one is left alone.
    const claimed = await this.claim(id);
    if (!claimed) return { calculationId: id, outcome: 'skipped' };
    const input = claimed.input as AnalysisInput;
    const started = performance.now();
    const watch = this.watchCancel(id);
    const threads = await this.threads();
    const stopThreads = () => {
      this.pool = null;
      this.stopPool(id, threads);
    };
    watch.signal.addEventListener('abort', stopThreads, { once: true });
    if (watch.signal.aborted) {
      watch.signal.removeEventListener('abort', stopThreads);
      watch.stop();
      stopThreads();
      return { calculationId: id, outcome: 'cancelled' };
    }
    let outcome: { summary: AnalysisSummary; values: Float64Array };
    try {
      outcome = await runAnalysis(input, threads, {
        onProgress: async (fraction) => {
          await job.updateProgress(Math.round(fraction * 100)).catch(() => undefined);
          await this.store.progress(id, fraction);
        },
        isCancelled: () => Promise.resolve(watch.signal.aborted),
      });
    } catch (err) {
      if (err instanceof AnalysisCancelled || watch.signal.aborted)
        return { calculationId: id, outcome: 'cancelled' };
      throw err;
    } finally {
      watch.signal.removeEventListener('abort', stopThreads);
      watch.stop();
    }
    const { summary, values } = outcome;
    const computeMs = performance.now() - started;
    await this.persist(`storing calculation ${id}`, () =>
      this.store.completeAnalysis(id, summary, values, computeMs, this.me),
    );
    return { calculationId: id, outcome: 'completed' };
  }
}
