import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The shop's default target margin of Fit to mask and Grow layers (null: the engine's default). */
export class ShopTargetMargin1764910000000 implements MigrationInterface {
  name = 'ShopTargetMargin1764910000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE shop_settings ADD COLUMN target_margin_percent double precision
        CHECK (target_margin_percent >= 0)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE shop_settings DROP COLUMN target_margin_percent');
  }
}
