import type { MigrationInterface, QueryRunner } from 'typeorm';

export class SpecMasksDesigns1764633800000 implements MigrationInterface {
  name = 'SpecMasksDesigns1764633800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE spec_masks (
        id serial PRIMARY KEY,
        name varchar(160) NOT NULL,
        customer_id integer NOT NULL REFERENCES customers(id),
        revision varchar(20) NOT NULL,
        bands jsonb NOT NULL,
        notes text NOT NULL DEFAULT '',
        version integer NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (customer_id, name, revision)
      )`);
    await q.query(`
      CREATE TABLE designs (
        id serial PRIMARY KEY,
        name varchar(160) NOT NULL,
        customer_id integer NOT NULL REFERENCES customers(id),
        spec_mask_id integer REFERENCES spec_masks(id) ON DELETE SET NULL,
        created_by integer NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE design_versions (
        id serial PRIMARY KEY,
        design_id integer NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        number integer NOT NULL CHECK (number >= 1),
        status varchar(16) NOT NULL
          CHECK (status IN ('draft', 'submitted', 'approved', 'returned', 'released', 'retired')),
        incident_material_id integer NOT NULL REFERENCES materials(id),
        substrate_material_id integer NOT NULL REFERENCES materials(id),
        substrate_thickness_mm double precision NOT NULL CHECK (substrate_thickness_mm > 0),
        back_surface varchar(16) NOT NULL CHECK (back_surface IN ('front-only', 'bare', 'same-coating')),
        reference_wavelength_nm double precision NOT NULL CHECK (reference_wavelength_nm > 0),
        notes text NOT NULL DEFAULT '',
        layers jsonb NOT NULL,
        materials_snapshot jsonb,
        row_version integer NOT NULL DEFAULT 1,
        created_by integer NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (design_id, number)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE design_versions');
    await q.query('DROP TABLE designs');
    await q.query('DROP TABLE spec_masks');
  }
}
