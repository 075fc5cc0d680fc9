import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

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
}

export function toCustomerView(c: Customer): CustomerView {
  return { id: c.id, name: c.name, contactEmail: c.contactEmail, notes: c.notes };
}
