import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Customers get contacts and can be archived (hidden from pickers, kept for their records); a spec
 * mask is either the customer's specification or an internal design target. Existing masks were
 * all customers' drawings, so they become 'customer'; their bands (angle lists) stay as they are.
 */
export class CustomerRecordsMaskKinds1764810000000 implements MigrationInterface {
  name = 'CustomerRecordsMaskKinds1764810000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE customers ADD COLUMN contacts jsonb NOT NULL DEFAULT '[]'`);
    await q.query('ALTER TABLE customers ADD COLUMN archived_at timestamptz');
    await q.query(
      `ALTER TABLE spec_masks ADD COLUMN kind varchar(10) NOT NULL DEFAULT 'customer' CHECK (kind IN ('customer', 'internal'))`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE spec_masks DROP COLUMN kind');
    await q.query('ALTER TABLE customers DROP COLUMN archived_at');
    await q.query('ALTER TABLE customers DROP COLUMN contacts');
  }
}
