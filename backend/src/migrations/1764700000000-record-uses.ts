import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Materials and spec masks keep their own record of being in use, written by the module that uses
 * them (a submitted version, a compliance report, a quote), instead of reading other modules'
 * tables: material_uses lists the design versions whose frozen snapshot holds a material, and
 * spec_masks.in_use_since marks a mask that a customer-visible record refers to.
 */
export class RecordUses1764700000000 implements MigrationInterface {
  name = 'RecordUses1764700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE material_uses (
        material_id integer NOT NULL REFERENCES materials(id) ON DELETE CASCADE,
        design_id integer NOT NULL,
        version_number integer NOT NULL,
        recorded_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (material_id, design_id, version_number)
      )`);
    await q.query(`
      INSERT INTO material_uses (material_id, design_id, version_number)
      SELECT m.id, v.design_id, v.number
        FROM design_versions v
        CROSS JOIN LATERAL jsonb_object_keys(v.materials_snapshot) AS k(id)
        JOIN materials m ON m.id::text = k.id
       WHERE v.status <> 'draft' AND v.materials_snapshot IS NOT NULL
      ON CONFLICT DO NOTHING`);
    await q.query('ALTER TABLE spec_masks ADD COLUMN in_use_since timestamptz');
    await q.query(`
      UPDATE spec_masks s SET in_use_since = now()
       WHERE EXISTS (SELECT 1 FROM designs d JOIN design_versions v ON v.design_id = d.id
                      WHERE d.spec_mask_id = s.id AND v.status IN ('submitted', 'approved', 'released', 'retired'))
          OR EXISTS (SELECT 1 FROM compliance_reports r WHERE r.spec_mask_id = s.id)
          OR EXISTS (SELECT 1 FROM quotes q WHERE q.spec_mask_id = s.id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE spec_masks DROP COLUMN in_use_since');
    await q.query('DROP TABLE material_uses');
  }
}
