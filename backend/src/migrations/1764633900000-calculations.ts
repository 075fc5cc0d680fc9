import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Calculations1764633900000 implements MigrationInterface {
  name = 'Calculations1764633900000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE calculations (
        id serial PRIMARY KEY,
        kind varchar(32) NOT NULL,
        input_hash char(64) NOT NULL,
        input jsonb NOT NULL,
        design_id integer REFERENCES designs(id) ON DELETE SET NULL,
        version_number integer,
        status varchar(16) NOT NULL CHECK (status IN ('queued', 'running', 'completed', 'failed', 'cancelled')),
        progress double precision NOT NULL DEFAULT 0,
        error text,
        summary jsonb,
        values bytea,
        created_by integer NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        started_at timestamptz,
        finished_at timestamptz,
        compute_ms double precision,
        processed_by varchar(200),
        completed_count integer NOT NULL DEFAULT 0,
        attempts integer NOT NULL DEFAULT 0
      )`);
    // One live or finished calculation per input: identical requests share it.
    await q.query(
      `CREATE UNIQUE INDEX calculations_live_input ON calculations (kind, input_hash) WHERE status IN ('queued', 'running', 'completed')`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE calculations');
  }
}
