import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Accounts count their changes, so an admin's edit (or Undo) based on an older view is refused. */
export class UserVersion1764930000000 implements MigrationInterface {
  name = 'UserVersion1764930000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE users ADD COLUMN version integer NOT NULL DEFAULT 1');
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE users DROP COLUMN version');
  }
}
