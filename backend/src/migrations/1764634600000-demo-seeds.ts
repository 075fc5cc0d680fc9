import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Which demo data sets have been created, so each is created once and never again. */
export class DemoSeeds1764634600000 implements MigrationInterface {
  name = 'DemoSeeds1764634600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE demo_seeds (name varchar(64) PRIMARY KEY, seeded_at timestamptz NOT NULL DEFAULT now())`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE demo_seeds');
  }
}
