import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Materials state their provenance as a kind (a published reference, measured on the shop's own
 * process with date and run, or a typical value), can be retired (hidden from pickers, kept for the
 * versions that use them) and keep the file they were imported from. Formula models get their
 * stated range as the engine's valid range, so they are no longer evaluated outside it.
 */
export class MaterialProvenanceFiles1764820000000 implements MigrationInterface {
  name = 'MaterialProvenanceFiles1764820000000';

  async up(q: QueryRunner): Promise<void> {
    for (const table of ['materials', 'material_revisions']) {
      await q.query(
        `ALTER TABLE ${table} ADD COLUMN provenance_kind varchar(10) NOT NULL DEFAULT 'published'
           CHECK (provenance_kind IN ('published', 'measured', 'typical'))`,
      );
      await q.query(`ALTER TABLE ${table} ADD COLUMN provenance_run varchar(120) NOT NULL DEFAULT ''`);
      await q.query(`UPDATE ${table} SET provenance_kind = 'typical' WHERE typical`);
    }
    await q.query('ALTER TABLE materials ADD COLUMN retired_at timestamptz');
    await q.query('ALTER TABLE materials ADD COLUMN source_file_name varchar(255)');
    await q.query('ALTER TABLE materials ADD COLUMN source_file_type varchar(100)');
    await q.query('ALTER TABLE materials ADD COLUMN source_file_bytes integer');
    await q.query(`
      CREATE TABLE material_source_files (
        material_id integer PRIMARY KEY REFERENCES materials(id) ON DELETE CASCADE,
        content bytea NOT NULL
      )`);
    await q.query(`
      UPDATE materials SET model = model || jsonb_build_object(
        'validNm', jsonb_build_object('from', range_from_nm, 'to', range_to_nm))
      WHERE model->>'model' IN ('cauchy', 'sellmeier') AND NOT model ? 'validNm'`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`UPDATE materials SET model = (model - 'validNm') - 'clamp'`);
    await q.query('DROP TABLE material_source_files');
    for (const col of ['source_file_bytes', 'source_file_type', 'source_file_name', 'retired_at']) {
      await q.query(`ALTER TABLE materials DROP COLUMN ${col}`);
    }
    for (const table of ['materials', 'material_revisions']) {
      await q.query(`ALTER TABLE ${table} DROP COLUMN provenance_run`);
      await q.query(`ALTER TABLE ${table} DROP COLUMN provenance_kind`);
    }
  }
}
