import type { MigrationInterface, QueryRunner } from 'typeorm';

export class ChamberRuns1764634200000 implements MigrationInterface {
  name = 'ChamberRuns1764634200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE chamber_runs (
        id serial PRIMARY KEY,
        design_id integer NOT NULL REFERENCES designs(id),
        version_number integer NOT NULL,
        chamber_id integer NOT NULL REFERENCES chambers(id),
        lot_number varchar(60) NOT NULL,
        run_date date NOT NULL,
        operator_id integer NOT NULL REFERENCES users(id),
        layer_readings jsonb NOT NULL DEFAULT '[]',
        durability jsonb NOT NULL DEFAULT '[]',
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE run_spectra (
        id serial PRIMARY KEY,
        run_id integer NOT NULL REFERENCES chamber_runs(id) ON DELETE CASCADE,
        quantity varchar(1) NOT NULL CHECK (quantity IN ('R', 'T')),
        angle_deg double precision NOT NULL,
        sample varchar(10) NOT NULL CHECK (sample IN ('witness', 'part')),
        filename varchar(255) NOT NULL,
        original_text text NOT NULL,
        wavelengths_nm jsonb NOT NULL,
        values_percent jsonb NOT NULL,
        uploaded_by integer NOT NULL REFERENCES users(id),
        uploaded_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE run_spectra');
    await q.query('DROP TABLE chamber_runs');
  }
}
