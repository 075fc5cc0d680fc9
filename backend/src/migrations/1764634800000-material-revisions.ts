import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Material revisions: a material that submitted, approved or released versions use is not edited
 * in place; its earlier content is kept as a numbered revision, readable later.
 */
export class MaterialRevisions1764634800000 implements MigrationInterface {
  name = 'MaterialRevisions1764634800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE materials ADD COLUMN revision integer NOT NULL DEFAULT 1');
    await q.query(`
      CREATE TABLE material_revisions (
        id serial PRIMARY KEY,
        material_id integer NOT NULL REFERENCES materials(id) ON DELETE CASCADE,
        revision integer NOT NULL,
        name varchar(120) NOT NULL,
        model jsonb NOT NULL,
        range_from_nm double precision NOT NULL,
        range_to_nm double precision NOT NULL,
        typical boolean NOT NULL,
        source text NOT NULL,
        source_date date,
        process_notes text NOT NULL,
        superseded_at timestamptz NOT NULL DEFAULT now(),
        superseded_by_id integer REFERENCES users(id),
        UNIQUE (material_id, revision)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE material_revisions');
    await q.query('ALTER TABLE materials DROP COLUMN revision');
  }
}
