import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import type { CustomerContact } from '@quietglass/shared/customers';

/** A customer of the shop: owns spec masks and stack designs. */
@Entity({ name: 'customers' })
export class Customer {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 160, unique: true })
  name: string;

  @Column({ name: 'contact_email', type: 'varchar', length: 254, nullable: true })
  contactEmail: string | null;

  @Column({ type: 'text', default: '' })
  notes: string;

  /** Contact people, each with a checked e-mail address. */
  @Column({ type: 'jsonb', default: () => "'[]'" })
  contacts: CustomerContact[];

  /** Set while archived: hidden from pickers, kept for its records, takes no new masks or quotes. */
  @Column({ name: 'archived_at', type: 'timestamptz', nullable: true })
  archivedAt: Date | null;

  /** Optimistic-locking counter: an edit sends it back; a stale one gets 409. */
  @VersionColumn()
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

export interface CustomerView {
  id: number;
  name: string;
  contactEmail: string | null;
  notes: string;
  contacts: CustomerContact[];
  archivedAt: string | null;
  version: number;
}

export function toCustomerView(c: Customer): CustomerView {
  return {
    id: c.id,
    name: c.name,
    contactEmail: c.contactEmail,
    notes: c.notes,
    contacts: c.contacts ?? [],
    archivedAt: c.archivedAt ? c.archivedAt.toISOString() : null,
    version: c.version,
  };
}
