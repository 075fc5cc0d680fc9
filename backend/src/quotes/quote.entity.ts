import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import type { QuantityBreak, QuoteEvent, QuoteStatus } from '@quietglass/shared/quotes';
import { Customer } from '../customers/customer.entity.js';
import { User } from '../users/user.entity.js';

/** A quote to a customer for parts coated to an approved design version. */
@Entity({ name: 'quotes' })
export class Quote {
  @PrimaryGeneratedColumn()
  id: number;

  @ManyToOne(() => Customer, { nullable: false, eager: true })
  @JoinColumn({ name: 'customer_id' })
  customer: Customer;

  @Column({ name: 'contact_email', type: 'varchar', length: 254 })
  contactEmail: string;

  @Column({ name: 'design_id', type: 'integer' })
  designId: number;

  @Column({ name: 'version_number', type: 'integer' })
  versionNumber: number;

  @Column({ name: 'spec_mask_id', type: 'integer' })
  specMaskId: number;

  @Column({ name: 'part_description', type: 'text' })
  partDescription: string;

  @Column({ name: 'quantity_breaks', type: 'jsonb' })
  quantityBreaks: QuantityBreak[];

  @Column({ type: 'char', length: 3 })
  currency: string;

  @Column({ name: 'lead_time_days', type: 'integer' })
  leadTimeDays: number;

  @Column({ name: 'valid_until', type: 'date' })
  validUntil: string;

  @Column({ type: 'text', default: '' })
  terms: string;

  @Column({ type: 'varchar', length: 10 })
  status: QuoteStatus;

  @Column({ name: 'report_ids', type: 'jsonb', default: () => "'[]'" })
  reportIds: number[];

  @Column({ type: 'jsonb', default: () => "'[]'" })
  history: QuoteEvent[];

  /** Why the last send failed; null after a successful one. */
  @Column({ name: 'last_send_error', type: 'text', nullable: true })
  lastSendError: string | null;

  @VersionColumn()
  version: number;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'created_by' })
  createdBy: User;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
