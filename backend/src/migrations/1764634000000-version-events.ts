import type { MigrationInterface, QueryRunner } from 'typeorm';

export class VersionEvents1764634000000 implements MigrationInterface {
  name = 'VersionEvents1764634000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE version_events (
        id serial PRIMARY KEY,
        design_id integer NOT NULL REFERENCES designs(id) ON DELETE CASCADE,
        version_number integer NOT NULL,
        from_status varchar(16) NOT NULL,
        to_status varchar(16) NOT NULL,
        actor_id integer NOT NULL REFERENCES users(id),
        comment text NOT NULL DEFAULT '',
        at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query('CREATE INDEX version_events_design ON version_events (design_id, version_number, at)');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE version_events');
  }
}
