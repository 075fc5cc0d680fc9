import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CreateUsers1764633600000 implements MigrationInterface {
  name = 'CreateUsers1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE users (
        id serial PRIMARY KEY,
        email varchar(254) NOT NULL UNIQUE,
        display_name varchar(120) NOT NULL,
        role varchar(16) NOT NULL CHECK (role IN ('admin', 'engineer', 'sales', 'operator')),
        password_hash varchar(100) NOT NULL,
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (email = lower(email))
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE users');
  }
}
