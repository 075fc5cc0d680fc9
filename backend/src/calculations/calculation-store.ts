import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { isOutage } from '../common/outage.js';

/** One point of an optimiser's merit history, streamed into the calculation's `live` column. */
export interface LivePoint {
  merit: number;
  iteration?: number;
  layerCount?: number;
}

/**
 * The worker's side of the calculations table: claiming a queued calculation, progress, and its
 * single final write. Every write is conditional on the calculation still running, so a cancel or
 * a second worker that picked up a stalled job can never overwrite a finished result.
 */
@Injectable()
export class CalculationStore {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  /** Marks the calculation running by `worker` and returns its input; null when it is no longer queued or running. */
  async claim(id: number, worker: string): Promise<{ input: unknown } | null> {
    const claimed = await this.db.query<[{ input: unknown }[], number]>(
      `UPDATE calculations SET status = 'running', started_at = now(), attempts = attempts + 1, processed_by = $2
       WHERE id = $1 AND status IN ('queued', 'running') RETURNING input`,
      [id, worker],
    );
    return claimed[0][0] ?? null;
  }

  /** Whether the calculation is still running (false once it is cancelled). */
  async isRunning(id: number): Promise<boolean> {
    const rows = await this.db.query<{ status: string }[]>('SELECT status FROM calculations WHERE id = $1', [
      id,
    ]);
    return rows[0]?.status === 'running';
  }

  /** Progress (0–1); lost silently in an outage, since the job goes on without it. */
  progress(id: number, fraction: number): Promise<void> {
    return this.note(`UPDATE calculations SET progress = $2 WHERE id = $1 AND status = 'running'`, [
      id,
      fraction,
    ]);
  }

  /** Progress plus one point appended to the live merit history; lost silently in an outage. */
  progressWithPoint(id: number, fraction: number, point: LivePoint): Promise<void> {
    return this.note(
      `UPDATE calculations SET progress = $2, live = jsonb_set(coalesce(live, '{"history": []}'), '{history}', coalesce(live->'history', '[]') || $3::jsonb)
       WHERE id = $1 AND status = 'running'`,
      [id, fraction, JSON.stringify([point])],
    );
  }

  /** Stores the result of an optimisation, at most once. */
  async complete(id: number, summary: unknown, computeMs: number, worker: string): Promise<void> {
    await this.db.query(
      `UPDATE calculations SET status = 'completed', progress = 1, summary = $2, finished_at = now(), compute_ms = $3,
         processed_by = $4, completed_count = completed_count + 1
       WHERE id = $1 AND status = 'running' AND completed_count = 0`,
      [id, JSON.stringify(summary), computeMs, worker],
    );
  }

  /** Stores the summary and the packed values of an analysis, at most once. */
  async completeAnalysis(
    id: number,
    summary: unknown,
    values: Float64Array,
    computeMs: number,
    worker: string,
  ): Promise<void> {
    await this.db.query(
      `UPDATE calculations SET status = 'completed', progress = 1, summary = $2, values = $3, finished_at = now(),
         compute_ms = $4, processed_by = $5, completed_count = completed_count + 1
       WHERE id = $1 AND status = 'running' AND completed_count = 0`,
      [
        id,
        JSON.stringify(summary),
        Buffer.from(values.buffer, values.byteOffset, values.byteLength),
        computeMs,
        worker,
      ],
    );
  }

  /** Marks a running calculation failed with its message. */
  async fail(id: number, message: string): Promise<void> {
    await this.db.query(
      `UPDATE calculations SET status = 'failed', error = $2, finished_at = now() WHERE id = $1 AND status = 'running'`,
      [id, message],
    );
  }

  private async note(sql: string, params: unknown[]): Promise<void> {
    try {
      await this.db.query(sql, params);
    } catch (err) {
      if (!isOutage(err)) throw err;
    }
  }
}
