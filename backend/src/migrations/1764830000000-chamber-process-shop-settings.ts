import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Process settings per chamber and material; the shop's name and logo for document headers. */
export class ChamberProcessShopSettings1764830000000 implements MigrationInterface {
  name = 'ChamberProcessShopSettings1764830000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE chamber_process_settings (
        chamber_id integer PRIMARY KEY REFERENCES chambers(id) ON DELETE CASCADE,
        settings jsonb NOT NULL,
        version integer NOT NULL CHECK (version >= 1),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE shop_settings (
        id integer PRIMARY KEY CHECK (id = 1),
        shop_name varchar(120) NOT NULL,
        logo bytea,
        logo_type varchar(32),
        version integer NOT NULL CHECK (version >= 1),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK ((logo IS NULL) = (logo_type IS NULL))
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE shop_settings');
    await q.query('DROP TABLE chamber_process_settings');
  }
}
