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
import type { SpecMaskKind } from '@quietglass/shared/customers';
import type { LimitBand } from '@quietglass/shared/optics/mask';
import { Customer } from '../customers/customer.entity.js';

/** A customer's spec mask: limit bands on R or T, one revision of the customer's drawing. */
@Entity({ name: 'spec_masks' })
export class SpecMaskRecord {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 160 })
  name: string;

  @ManyToOne(() => Customer, { nullable: false, eager: true })
  @JoinColumn({ name: 'customer_id' })
  customer: Customer;

  @Column({ type: 'varchar', length: 20 })
  revision: string;

  /** The customer's own specification, or a target the shop set for design work (never sent out). */
  @Column({ type: 'varchar', length: 10, default: 'customer' })
  kind: SpecMaskKind;

  /** Limit bands as the engine normalised them. */
  @Column({ type: 'jsonb' })
  bands: LimitBand[];

  @Column({ type: 'text', default: '' })
  notes: string;

  @VersionColumn()
  version: number;

  /** The next revision, once this one was revised; a revised mask stays readable but never changes. */
  /** Since when a submitted version, a compliance report or a quote refers to the mask (then it is never edited in place). */
  @Column({ name: 'in_use_since', type: 'timestamptz', nullable: true, select: false })
  inUseSince: Date | null;

  @Column({ name: 'superseded_by_id', type: 'integer', nullable: true })
  supersededById: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

export interface SpecMaskView {
  id: number;
  name: string;
  customer: { id: number; name: string };
  revision: string;
  kind: SpecMaskKind;
  bands: LimitBand[];
  notes: string;
  version: number;
  /** Set once the mask was revised: the id of its next revision. */
  supersededById: number | null;
  updatedAt: string;
}

export function toSpecMaskView(m: SpecMaskRecord): SpecMaskView {
  return {
    id: m.id,
    name: m.name,
    customer: { id: m.customer.id, name: m.customer.name },
    revision: m.revision,
    kind: m.kind,
    bands: m.bands,
    notes: m.notes,
    version: m.version,
    supersededById: m.supersededById,
    updatedAt: m.updatedAt.toISOString(),
  };
}
