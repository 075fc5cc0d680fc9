import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Chambers1764634100000 implements MigrationInterface {
  name = 'Chambers1764634100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE chambers (
        id serial PRIMARY KEY,
        name varchar(120) NOT NULL UNIQUE,
        monitor_wavelengths_nm jsonb NOT NULL,
        monitor_chip_material_id integer NOT NULL REFERENCES materials(id),
        materials jsonb NOT NULL,
        notes text NOT NULL DEFAULT '',
        version integer NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE chambers');
  }
}
