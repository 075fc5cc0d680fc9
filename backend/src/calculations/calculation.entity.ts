import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { AnalysisInput, AnalysisSummary } from '@quietglass/shared/analysis';
import type { CalculationKind, CalculationStatus, LiveProgress } from '@quietglass/shared/calculations';
import type { OptimiseInput } from './optimise-jobs.js';
import { User } from '../users/user.entity.js';

/** A compute-queue job and, once done, its stored result. */
@Entity({ name: 'calculations' })
export class Calculation {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 32 })
  kind: CalculationKind;

  /** SHA-256 of the canonical input: an identical request finds the stored result. */
  @Column({ name: 'input_hash', type: 'char', length: 64 })
  inputHash: string;

  @Column({ type: 'jsonb' })
  input: AnalysisInput | OptimiseInput;

  @Column({ name: 'design_id', type: 'integer', nullable: true })
  designId: number | null;

  @Column({ name: 'version_number', type: 'integer', nullable: true })
  versionNumber: number | null;

  @Column({ type: 'varchar', length: 16 })
  status: CalculationStatus;

  /** 0 to 1. */
  @Column({ type: 'double precision', default: 0 })
  progress: number;

  @Column({ type: 'text', nullable: true })
  error: string | null;

  /** The analysis summary, or the optimisation result (FitResult, GrowResult, YieldForecast, diagnosis). */
  @Column({ type: 'jsonb', nullable: true })
  summary: AnalysisSummary | Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  live: LiveProgress | null;

  @Column({ name: 'run_id', type: 'integer', nullable: true })
  runId: number | null;

  /** R, T, A as little-endian float64, in the order of analysisIndex. */
  @Column({ type: 'bytea', nullable: true, select: false })
  values: Buffer | null;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'created_by' })
  createdBy: User;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column({ name: 'started_at', type: 'timestamptz', nullable: true })
  startedAt: Date | null;

  @Column({ name: 'finished_at', type: 'timestamptz', nullable: true })
  finishedAt: Date | null;

  /** Wall time of the computation itself, ms. */
  @Column({ name: 'compute_ms', type: 'double precision', nullable: true })
  computeMs: number | null;

  /** Which worker (host:pid) ran it, and how many times a result was stored (must stay ≤ 1). */
  @Column({ name: 'processed_by', type: 'varchar', length: 200, nullable: true })
  processedBy: string | null;

  @Column({ name: 'completed_count', type: 'integer', default: 0 })
  completedCount: number;

  @Column({ type: 'integer', default: 0 })
  attempts: number;
}
