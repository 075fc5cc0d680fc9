import type { MigrationInterface, QueryRunner } from 'typeorm';

export class ReportsQuotesOutbox1764634300000 implements MigrationInterface {
  name = 'ReportsQuotesOutbox1764634300000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE compliance_reports (
        id serial PRIMARY KEY,
        design_id integer NOT NULL REFERENCES designs(id),
        version_number integer NOT NULL,
        spec_mask_id integer NOT NULL REFERENCES spec_masks(id),
        hide_layers boolean NOT NULL,
        run_id integer REFERENCES chamber_runs(id),
        spectrum_id integer REFERENCES run_spectra(id),
        summary jsonb NOT NULL,
        pdf bytea NOT NULL,
        created_by integer NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE quotes (
        id serial PRIMARY KEY,
        customer_id integer NOT NULL REFERENCES customers(id),
        contact_email varchar(254) NOT NULL,
        design_id integer NOT NULL REFERENCES designs(id),
        version_number integer NOT NULL,
        spec_mask_id integer NOT NULL REFERENCES spec_masks(id),
        part_description text NOT NULL,
        quantity_breaks jsonb NOT NULL,
        currency char(3) NOT NULL,
        lead_time_days integer NOT NULL CHECK (lead_time_days > 0),
        valid_until date NOT NULL,
        terms text NOT NULL DEFAULT '',
        status varchar(10) NOT NULL CHECK (status IN ('draft', 'sent', 'accepted', 'declined', 'expired')),
        report_ids jsonb NOT NULL DEFAULT '[]',
        history jsonb NOT NULL DEFAULT '[]',
        last_send_error text,
        version integer NOT NULL,
        created_by integer NOT NULL REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE outbox_messages (
        id serial PRIMARY KEY,
        message_id varchar(500) NOT NULL DEFAULT '',
        from_address text NOT NULL,
        to_address text NOT NULL,
        subject text NOT NULL,
        text text NOT NULL DEFAULT '',
        received_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE outbox_attachments (
        id serial PRIMARY KEY,
        message_id integer NOT NULL REFERENCES outbox_messages(id) ON DELETE CASCADE,
        filename varchar(255) NOT NULL,
        content_type varchar(120) NOT NULL,
        size integer NOT NULL,
        content bytea NOT NULL
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE outbox_attachments');
    await q.query('DROP TABLE outbox_messages');
    await q.query('DROP TABLE quotes');
    await q.query('DROP TABLE compliance_reports');
  }
}
