import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Server-side sessions (revocable), and the forced password change after an admin sets one. */
export class Sessions1764634700000 implements MigrationInterface {
  name = 'Sessions1764634700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE sessions (
        id uuid PRIMARY KEY,
        user_id integer NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        created_at timestamptz NOT NULL DEFAULT now(),
        last_seen_at timestamptz NOT NULL,
        expires_at timestamptz NOT NULL,
        ended_at timestamptz,
        end_reason varchar(32)
      )`);
    await q.query(`CREATE INDEX sessions_user_open ON sessions (user_id) WHERE ended_at IS NULL`);
    await q.query(`ALTER TABLE users ADD COLUMN must_change_password boolean NOT NULL DEFAULT false`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE users DROP COLUMN must_change_password');
    await q.query('DROP TABLE sessions');
  }
}
