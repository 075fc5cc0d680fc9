import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Chamber calibration: the shop's calibration settings (one row) and every accepted or rejected
 * suggestion, with what it rested on and the engineer's comment. The run history itself stays in
 * chamber runs and their Run diagnoses.
 */
export class ChamberCalibration1764840000000 implements MigrationInterface {
  name = 'ChamberCalibration1764840000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE calibration_settings (
      id integer PRIMARY KEY CHECK (id = 1),
      threshold_percent double precision NOT NULL CHECK (threshold_percent > 0 AND threshold_percent <= 50),
      min_runs integer NOT NULL CHECK (min_runs >= 2 AND min_runs <= 100),
      version integer NOT NULL DEFAULT 1,
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
    await q.query('INSERT INTO calibration_settings (id, threshold_percent, min_runs) VALUES (1, 1, 4)');
    await q.query(`CREATE TABLE calibration_decisions (
      id serial PRIMARY KEY,
      chamber_id integer NOT NULL REFERENCES chambers(id),
      suggestion_key varchar(200) NOT NULL,
      kind varchar(10) NOT NULL CHECK (kind IN ('material', 'common')),
      material_ids jsonb NOT NULL,
      decision varchar(10) NOT NULL CHECK (decision IN ('accepted', 'rejected')),
      previous_tooling_factor double precision,
      new_tooling_factor double precision,
      correction double precision NOT NULL,
      correction_sigma double precision NOT NULL,
      last_run_id integer NOT NULL,
      comment text NOT NULL,
      decided_by integer NOT NULL REFERENCES users(id),
      decided_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (chamber_id, suggestion_key)
    )`);
    await q.query(
      'CREATE INDEX calibration_decisions_chamber ON calibration_decisions (chamber_id, decided_at)',
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE calibration_decisions');
    await q.query('DROP TABLE calibration_settings');
  }
}
