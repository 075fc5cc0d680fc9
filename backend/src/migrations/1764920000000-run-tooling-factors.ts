import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The chamber's tooling factor of each material when a run was logged, so the calibration history
 * reads every run against the factor it was made with, also after a manual edit of the chamber.
 * Runs logged before this column have none (the history then falls back to its decisions).
 */
export class RunToolingFactors1764920000000 implements MigrationInterface {
  name = 'RunToolingFactors1764920000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE chamber_runs ADD COLUMN tooling_factors jsonb');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE chamber_runs DROP COLUMN tooling_factors');
  }
}
