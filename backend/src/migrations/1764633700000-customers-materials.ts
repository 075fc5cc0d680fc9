import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CustomersMaterials1764633700000 implements MigrationInterface {
  name = 'CustomersMaterials1764633700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE customers (
        id serial PRIMARY KEY,
        name varchar(160) NOT NULL UNIQUE,
        contact_email varchar(254),
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE materials (
        id serial PRIMARY KEY,
        name varchar(120) NOT NULL UNIQUE,
        model jsonb NOT NULL,
        range_from_nm double precision NOT NULL,
        range_to_nm double precision NOT NULL,
        typical boolean NOT NULL DEFAULT false,
        source text NOT NULL DEFAULT '',
        source_date date,
        process_notes text NOT NULL DEFAULT '',
        version integer NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (range_from_nm > 0 AND range_to_nm > range_from_nm)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE materials');
    await q.query('DROP TABLE customers');
  }
}
