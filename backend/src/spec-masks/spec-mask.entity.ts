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

  /** Limit bands as the engine normalised them. */
  @Column({ type: 'jsonb' })
  bands: LimitBand[];

  @Column({ type: 'text', default: '' })
  notes: string;

  @VersionColumn()
  version: number;

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
  bands: LimitBand[];
  notes: string;
  version: number;
  updatedAt: string;
}

export function toSpecMaskView(m: SpecMaskRecord): SpecMaskView {
  return {
    id: m.id,
    name: m.name,
    customer: { id: m.customer.id, name: m.customer.name },
    revision: m.revision,
    bands: m.bands,
    notes: m.notes,
    version: m.version,
    updatedAt: m.updatedAt.toISOString(),
  };
}
