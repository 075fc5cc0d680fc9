import os from 'node:os';
import { Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { Processor, WorkerHost } from '@nestjs/bullmq';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Job } from 'bullmq';
import { DataSource } from 'typeorm';
import { SpectrumWorkerPool } from '@quietglass/shared/node/parallel';
import type { AnalysisInput } from '@quietglass/shared/analysis';
import { AnalysisCancelled, runAnalysis } from '../calculations/analysis-runner.js';
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

  async process(job: Job<ComputeJobData>): Promise<{ calculationId: number; outcome: string }> {
    if (job.name !== ANALYSIS_JOB) throw new Error(`Unknown compute job "${job.name}"`);
    const id = job.data.calculationId;
    // Claim the calculation; a cancelled or finished one is left alone.
    const claimed = (await this.db.query(
      `UPDATE calculations SET status = 'running', started_at = now(), attempts = attempts + 1, processed_by = $2
       WHERE id = $1 AND status IN ('queued', 'running') RETURNING input`,
      [id, this.me],
    )) as [{ input: AnalysisInput }[], number];
    const rows = claimed[0];
    if (rows.length === 0) return { calculationId: id, outcome: 'skipped' };
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
      const message = err instanceof Error ? err.message : String(err);
      await this.db.query(
        `UPDATE calculations SET status = 'failed', error = $2, finished_at = now() WHERE id = $1 AND status = 'running'`,
        [id, message],
      );
      this.logger.warn(`calculation ${id} failed: ${message}`);
      throw err;
    }
  }
}
