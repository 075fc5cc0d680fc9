import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  OneToMany,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import { Customer } from '../customers/customer.entity.js';
import { User } from '../users/user.entity.js';
import { DesignVersion } from './design-version.entity.js';

/** A stack design for a customer; its content lives in numbered versions. */
@Entity({ name: 'designs' })
export class Design {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 160 })
  name: string;

  @ManyToOne(() => Customer, { nullable: false, eager: true })
  @JoinColumn({ name: 'customer_id' })
  customer: Customer;

  @Column({ name: 'spec_mask_id', type: 'integer', nullable: true })
  specMaskId: number | null;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'created_by' })
  createdBy: User;

  /** Optimistic-locking counter of the name and spec mask (not bumped by version saves). */
  @Column({ type: 'integer', default: 1 })
  version: number;

  @OneToMany(() => DesignVersion, (v) => v.design)
  versions: Relation<DesignVersion>[];

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
