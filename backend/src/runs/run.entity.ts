import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';
import type { ToolingFactorsKept } from '@quietglass/shared/chambers';
import type { DurabilityResult, LayerReading, RunRemark } from '@quietglass/shared/runs';
import { User } from '../users/user.entity.js';

/** One chamber run of a released recipe: a lot, its readings and witness results. */
@Entity({ name: 'chamber_runs' })
export class ChamberRun {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'design_id', type: 'integer' })
  designId: number;

  @Column({ name: 'version_number', type: 'integer' })
  versionNumber: number;

  @Column({ name: 'chamber_id', type: 'integer' })
  chamberId: number;

  @Column({ name: 'lot_number', type: 'varchar', length: 60 })
  lotNumber: string;

  @Column({ name: 'run_date', type: 'date' })
  runDate: string;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'operator_id' })
  operator: User;

  @Column({ name: 'layer_readings', type: 'jsonb', default: () => "'[]'" })
  layerReadings: LayerReading[];

  @Column({ type: 'jsonb', default: () => "'[]'" })
  durability: DurabilityResult[];

  @Column({ type: 'text', default: '' })
  notes: string;

  /** Material id → the chamber's tooling factor when the run was logged (null before it was kept). */
  @Column({ name: 'tooling_factors', type: 'jsonb', nullable: true })
  toolingFactors: ToolingFactorsKept | null;

  /** Remarks by anyone who reads the run, appended in one statement (never edited). */
  @Column({ type: 'jsonb', default: () => "'[]'" })
  remarks: RunRemark[];

  /** Row version for optimistic locking (see common/optimistic-lock.ts). */
  @Column({ type: 'integer', default: 1 })
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

/** A measured spectrum of a run's witness or part, with the file exactly as uploaded. */
@Entity({ name: 'run_spectra' })
export class RunSpectrum {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'run_id', type: 'integer' })
  runId: number;

  @Column({ type: 'varchar', length: 1 })
  quantity: 'R' | 'T';

  @Column({ name: 'angle_deg', type: 'double precision' })
  angleDeg: number;

  @Column({ type: 'varchar', length: 10 })
  sample: 'witness' | 'part';

  @Column({ type: 'varchar', length: 255 })
  filename: string;

  @Column({ name: 'original_text', type: 'text', select: false })
  originalText: string;

  @Column({ name: 'wavelengths_nm', type: 'jsonb' })
  wavelengthsNm: number[];

  @Column({ name: 'values_percent', type: 'jsonb' })
  valuesPercent: number[];

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'uploaded_by' })
  uploadedBy: User;

  @CreateDateColumn({ name: 'uploaded_at', type: 'timestamptz' })
  uploadedAt: Date;
}
