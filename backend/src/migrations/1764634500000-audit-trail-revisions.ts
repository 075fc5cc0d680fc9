import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The general audit trail (every change to a record that matters, with who and when), version
 * counters for optimistic locking on every editable record, recorded version saves, revisions of
 * spec masks, and remarks on chamber runs.
 */
export class AuditTrailRevisions1764634500000 implements MigrationInterface {
  name = 'AuditTrailRevisions1764634500000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE audit_events (
        id serial PRIMARY KEY,
        at timestamptz NOT NULL DEFAULT now(),
        actor_id integer REFERENCES users(id),
        entity varchar(32) NOT NULL,
        entity_id integer NOT NULL,
        action varchar(40) NOT NULL,
        summary text NOT NULL DEFAULT '',
        details jsonb NOT NULL DEFAULT '{}'
      )`);
    await q.query('CREATE INDEX audit_events_record ON audit_events (entity, entity_id, at)');
    await q.query('CREATE INDEX audit_events_actor ON audit_events (actor_id, at)');
    await q.query('CREATE INDEX audit_events_at ON audit_events (at)');
    // The lifecycle steps recorded so far become the first entries of the general trail.
    await q.query(`
      INSERT INTO audit_events (at, actor_id, entity, entity_id, action, summary, details)
      SELECT at, actor_id, 'design', design_id, to_status,
             'version ' || version_number || ': ' || from_status || ' → ' || to_status,
             jsonb_build_object('versionNumber', version_number, 'from', from_status, 'to', to_status, 'comment', comment)
      FROM version_events ORDER BY at, id`);

    await q.query(`ALTER TABLE version_events ADD COLUMN kind varchar(12) NOT NULL DEFAULT 'status'`);
    await q.query('ALTER TABLE customers ADD COLUMN version integer NOT NULL DEFAULT 1');
    await q.query('ALTER TABLE designs ADD COLUMN version integer NOT NULL DEFAULT 1');
    await q.query('ALTER TABLE chamber_runs ADD COLUMN version integer NOT NULL DEFAULT 1');
    await q.query(`ALTER TABLE chamber_runs ADD COLUMN remarks jsonb NOT NULL DEFAULT '[]'`);
    await q.query('ALTER TABLE spec_masks ADD COLUMN superseded_by_id integer REFERENCES spec_masks(id)');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE spec_masks DROP COLUMN superseded_by_id');
    await q.query('ALTER TABLE chamber_runs DROP COLUMN remarks, DROP COLUMN version');
    await q.query('ALTER TABLE designs DROP COLUMN version');
    await q.query('ALTER TABLE customers DROP COLUMN version');
    await q.query('ALTER TABLE version_events DROP COLUMN kind');
    await q.query('DROP TABLE audit_events');
  }
}
