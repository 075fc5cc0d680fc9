import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Optimisation jobs stream their progress (merit per iteration) into `live`. */
export class CalculationLive1764634400000 implements MigrationInterface {
  name = 'CalculationLive1764634400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE calculations ADD COLUMN live jsonb`);
    await q.query(
      `ALTER TABLE calculations ADD COLUMN run_id integer REFERENCES chamber_runs(id) ON DELETE SET NULL`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE calculations DROP COLUMN run_id');
    await q.query('ALTER TABLE calculations DROP COLUMN live');
  }
}
