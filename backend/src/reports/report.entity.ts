import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { ReportSummary } from '@quietglass/shared/reports';
import { User } from '../users/user.entity.js';

/** A spec-compliance report (PDF) of an approved design version against a spec mask. */
@Entity({ name: 'compliance_reports' })
export class ComplianceReport {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'design_id', type: 'integer' })
  designId: number;

  @Column({ name: 'version_number', type: 'integer' })
  versionNumber: number;

  @Column({ name: 'spec_mask_id', type: 'integer' })
  specMaskId: number;

  @Column({ name: 'hide_layers', type: 'boolean' })
  hideLayers: boolean;

  @Column({ name: 'run_id', type: 'integer', nullable: true })
  runId: number | null;

  @Column({ name: 'spectrum_id', type: 'integer', nullable: true })
  spectrumId: number | null;

  @Column({ type: 'jsonb' })
  summary: ReportSummary;

  @Column({ type: 'bytea', select: false })
  pdf: Buffer;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'created_by' })
  createdBy: User;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
