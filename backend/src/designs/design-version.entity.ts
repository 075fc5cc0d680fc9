import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  Unique,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import type {
  BackSurfaceTreatment,
  DesignLayer,
  NamedModel,
  VersionStatus,
} from '@quietglass/shared/designs';
import { User } from '../users/user.entity.js';
import { Design } from './design.entity.js';

/** One numbered version of a design: the whole stack, editable only while a draft. */
@Entity({ name: 'design_versions' })
@Unique(['design', 'number'])
export class DesignVersion {
  @PrimaryGeneratedColumn()
  id: number;

  @ManyToOne(() => Design, (d) => d.versions, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'design_id' })
  design: Relation<Design>;

  @Column({ name: 'design_id', type: 'integer' })
  designId: number;

  @Column({ type: 'integer' })
  number: number;

  @Column({ type: 'varchar', length: 16 })
  status: VersionStatus;

  @Column({ name: 'incident_material_id', type: 'integer' })
  incidentMaterialId: number;

  @Column({ name: 'substrate_material_id', type: 'integer' })
  substrateMaterialId: number;

  @Column({ name: 'substrate_thickness_mm', type: 'double precision' })
  substrateThicknessMm: number;

  @Column({ name: 'back_surface', type: 'varchar', length: 16 })
  backSurface: BackSurfaceTreatment;

  @Column({ name: 'reference_wavelength_nm', type: 'double precision' })
  referenceWavelengthNm: number;

  @Column({ type: 'text', default: '' })
  notes: string;

  @Column({ type: 'jsonb' })
  layers: DesignLayer[];

  @Column({ name: 'materials_snapshot', type: 'jsonb', nullable: true })
  materialsSnapshot: Record<string, NamedModel> | null;

  /** Optimistic-locking counter, bumped by every save. */
  @Column({ name: 'row_version', type: 'integer', default: 1 })
  rowVersion: number;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'created_by' })
  createdBy: User;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
