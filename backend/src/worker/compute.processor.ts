import os from 'node:os';
import { Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { Processor, WorkerHost } from '@nestjs/bullmq';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Job } from 'bullmq';
import { DataSource } from 'typeorm';
import { SpectrumWorkerPool } from '@quietglass/shared/node/parallel';
import type { AnalysisInput } from '@quietglass/shared/analysis';
import { YieldWorkerPool } from '@quietglass/shared/node/yield-parallel';
import { parseStack } from '@quietglass/shared/optics/stack';
import { AnalysisCancelled, runAnalysis } from '../calculations/analysis-runner.js';
import type { OptimiseInput, ProgressMessage, YieldInput } from '../calculations/optimise-jobs.js';
import { runInThread } from './optimise-runner.js';
import { ANALYSIS_JOB, COMPUTE_QUEUE, type ComputeJobData } from '../queue/queue.constants.js';

const envMs = (name: string, fallback: number) => {
  const v = Number(process.env[name]);
  return Number.isInteger(v) && v > 0 ? v : fallback;
};

/**
 * Runs compute-queue jobs. One job at a time per process, using every core through worker
 * threads. A worker that dies mid-job loses its lock; BullMQ's stalled-job check hands the job to
 * another worker, and the database write of the result happens at most once.
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

  constructor(@InjectDataSource() private readonly db: DataSource) {
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

  async process(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    if (job.name === ANALYSIS_JOB) return this.analysis(job);
    if (['fit', 'grow', 'diagnosis', 'yield'].includes(job.name)) return this.optimisation(job);
    throw new Error(`Unknown compute job "${job.name}"`);
  }

  /**
   * Fit to mask, Grow layers, Run diagnosis (in a worker thread) and Yield forecast (across the
   * yield thread pool): merit per iteration is streamed into `live`, cancellation is checked at each
   * report, and the result is stored at most once.
   */
  private async optimisation(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    const id = job.data.calculationId;
    const rows = await this.claim(id);
    if (!rows) return { calculationId: id, outcome: 'skipped' };
    const input = rows.input as unknown as OptimiseInput;
    const started = performance.now();
    const cancelled = async () => {
      const [row] = (await this.db.query('SELECT status FROM calculations WHERE id = $1', [id])) as {
        status: string;
      }[];
      return row?.status !== 'running';
    };
    try {
      let result: unknown;
      if (input.kind === 'yield') {
        result = await this.forecast(id, job, input, cancelled);
      } else {
        result = await runInThread(input, async (p: ProgressMessage) => {
          await job.updateProgress(Math.round(p.fraction * 100));
          const point = {
            merit: p.merit ?? NaN,
            ...(p.iteration !== undefined ? { iteration: p.iteration } : {}),
            ...(p.layerCount !== undefined ? { layerCount: p.layerCount } : {}),
          };
          await this.db.query(
            `UPDATE calculations SET progress = $2, live = jsonb_set(coalesce(live, '{"history": []}'), '{history}', coalesce(live->'history', '[]') || $3::jsonb)
             WHERE id = $1 AND status = 'running'`,
            [id, p.fraction, JSON.stringify([point])],
          );
          return !(await cancelled());
        });
      }
      if (result === null) return { calculationId: id, outcome: 'cancelled' };
      await this.db.query(
        `UPDATE calculations SET status = 'completed', progress = 1, summary = $2, finished_at = now(), compute_ms = $3,
           processed_by = $4, completed_count = completed_count + 1
         WHERE id = $1 AND status = 'running' AND completed_count = 0`,
        [id, JSON.stringify(result), performance.now() - started, this.me],
      );
      return { calculationId: id, outcome: 'completed' };
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      if (message === 'cancelled') return { calculationId: id, outcome: 'cancelled' };
      await this.fail(id, message);
      throw err;
    }
  }

  /** Yield forecast on the thread pool; returns null when cancelled. */
  private async forecast(
    id: number,
    job: Job<ComputeJobData>,
    input: YieldInput,
    cancelled: () => Promise<boolean>,
  ) {
    this.yieldPool ??= YieldWorkerPool.create({
      size: envMs('QG_COMPUTE_THREADS', os.availableParallelism()),
    });
    const pool = await this.yieldPool;
    let stop = false;
    const watch = setInterval(() => {
      void cancelled().then((c) => {
        stop = stop || c;
      });
    }, 300);
    try {
      const result = await pool.forecast(
        parseStack(input.stack),
        { bands: input.bands },
        {
          ...input.options,
          layerMaterials: input.layerMaterials,
          back: input.back,
          onProgress: (fraction) => {
            void job.updateProgress(Math.round(fraction * 100));
            void this.db.query(`UPDATE calculations SET progress = $2 WHERE id = $1 AND status = 'running'`, [
              id,
              fraction,
            ]);
            return !stop;
          },
        },
      );
      return result.stoppedBy === 'cancelled' ? null : result;
    } finally {
      clearInterval(watch);
    }
  }

  private async claim(id: number): Promise<{ input: unknown } | null> {
    const claimed = (await this.db.query(
      `UPDATE calculations SET status = 'running', started_at = now(), attempts = attempts + 1, processed_by = $2
       WHERE id = $1 AND status IN ('queued', 'running') RETURNING input`,
      [id, this.me],
    )) as [{ input: unknown }[], number];
    return claimed[0][0] ?? null;
  }

  private async fail(id: number, message: string): Promise<void> {
    await this.db.query(
      `UPDATE calculations SET status = 'failed', error = $2, finished_at = now() WHERE id = $1 AND status = 'running'`,
      [id, message],
    );
    this.logger.warn(`calculation ${id} failed: ${message}`);
  }

  private async analysis(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    const id = job.data.calculationId;
    // Claim the calculation; a cancelled or finished one is left alone.
    const claimed = await this.claim(id);
    if (!claimed) return { calculationId: id, outcome: 'skipped' };
    const rows = [claimed as { input: AnalysisInput }];
    const started = performance.now();
    try {
      const { summary, values } = await runAnalysis(rows[0].input, await this.threads(), {
        onProgress: async (fraction) => {
          await job.updateProgress(Math.round(fraction * 100));
          await this.db.query(`UPDATE calculations SET progress = $2 WHERE id = $1 AND status = 'running'`, [
            id,
            fraction,
          ]);
        },
        isCancelled: async () => {
          const [row] = (await this.db.query('SELECT status FROM calculations WHERE id = $1', [id])) as {
            status: string;
          }[];
          return row?.status !== 'running';
        },
      });
      const computeMs = performance.now() - started;
      await this.db.query(
        `UPDATE calculations SET status = 'completed', progress = 1, summary = $2, values = $3, finished_at = now(),
           compute_ms = $4, processed_by = $5, completed_count = completed_count + 1
         WHERE id = $1 AND status = 'running' AND completed_count = 0`,
        [
          id,
          JSON.stringify(summary),
          Buffer.from(values.buffer, values.byteOffset, values.byteLength),
          computeMs,
          this.me,
        ],
      );
      return { calculationId: id, outcome: 'completed' };
    } catch (err) {
      if (err instanceof AnalysisCancelled) return { calculationId: id, outcome: 'cancelled' };
      await this.fail(id, err instanceof Error ? err.message : String(err));
      throw err;
    }
  }
}
