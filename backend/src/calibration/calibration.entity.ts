import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';
import type { CalibrationDecisionView } from '@quietglass/shared/calibration';
import { User } from '../users/user.entity.js';

/** The shop's calibration settings (a single row, id 1). */
@Entity({ name: 'calibration_settings' })
export class CalibrationSettingsRecord {
  @PrimaryColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'threshold_percent', type: 'double precision' })
  thresholdPercent: number;

  @Column({ name: 'min_runs', type: 'integer' })
  minRuns: number;

  @Column({ type: 'integer', default: 1 })
  version: number;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

/** An engineer's decision on a calibration suggestion, with what the suggestion rested on. */
@Entity({ name: 'calibration_decisions' })
export class CalibrationDecision {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'chamber_id', type: 'integer' })
  chamberId: number;

  /** The suggestion as it was shown (kind, materials, last run, factors, chamber version). */
  @Column({ name: 'suggestion_key', type: 'varchar', length: 200 })
  suggestionKey: string;

  @Column({ type: 'varchar', length: 10 })
  kind: 'material' | 'common';

  @Column({ name: 'material_ids', type: 'jsonb' })
  materialIds: number[];

  @Column({ type: 'varchar', length: 10 })
  decision: 'accepted' | 'rejected';

  @Column({ name: 'previous_tooling_factor', type: 'double precision', nullable: true })
  previousToolingFactor: number | null;

  @Column({ name: 'new_tooling_factor', type: 'double precision', nullable: true })
  newToolingFactor: number | null;

  @Column({ type: 'double precision' })
  correction: number;

  @Column({ name: 'correction_sigma', type: 'double precision' })
  correctionSigma: number;

  @Column({ name: 'last_run_id', type: 'integer' })
  lastRunId: number;

  @Column({ type: 'text' })
  comment: string;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'decided_by' })
  decidedBy: User;

  @CreateDateColumn({ name: 'decided_at', type: 'timestamptz' })
  decidedAt: Date;
}

export function toDecisionView(d: CalibrationDecision): CalibrationDecisionView {
  return {
    id: d.id,
    chamberId: d.chamberId,
    kind: d.kind,
    materialIds: d.materialIds,
    decision: d.decision,
    previousToolingFactor: d.previousToolingFactor,
    newToolingFactor: d.newToolingFactor,
    correction: { value: d.correction, sigma: d.correctionSigma },
    lastRunId: d.lastRunId,
    comment: d.comment,
    decidedBy: d.decidedBy.displayName,
    decidedAt: d.decidedAt.toISOString(),
  };
}
