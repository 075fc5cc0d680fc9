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
import type { MaterialRevisionView, MaterialView } from '@quietglass/shared/materials';
import type { MaterialModel } from '@quietglass/shared/optics/dispersion';
import { User } from '../users/user.entity.js';

/** A coating or substrate material: a dispersion model, its valid range and where the data came from. */
@Entity({ name: 'materials' })
export class Material {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 120, unique: true })
  name: string;

  /** The engine's dispersion model, stored as validated JSON. */
  @Column({ type: 'jsonb' })
  model: MaterialModel;

  @Column({ name: 'range_from_nm', type: 'double precision' })
  rangeFromNm: number;

  @Column({ name: 'range_to_nm', type: 'double precision' })
  rangeToNm: number;

  /** A typical literature/shop value, not measured on this shop's process. */
  @Column({ type: 'boolean', default: false })
  typical: boolean;

  @Column({ type: 'text', default: '' })
  source: string;

  @Column({ name: 'source_date', type: 'date', nullable: true })
  sourceDate: string | null;

  @Column({ name: 'process_notes', type: 'text', default: '' })
  processNotes: string;

  /**
   * Content revision: moves on when a material that frozen versions use is edited (those versions
   * keep the revision they froze); edits of a material only drafts use stay in the same revision.
   */
  @Column({ type: 'integer', default: 1 })
  revision: number;

  @VersionColumn()
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

/** The content a material had before an edit moved it to its next revision. */
@Entity({ name: 'material_revisions' })
export class MaterialRevision {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'material_id', type: 'integer' })
  materialId: number;

  @Column({ type: 'integer' })
  revision: number;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'jsonb' })
  model: MaterialModel;

  @Column({ name: 'range_from_nm', type: 'double precision' })
  rangeFromNm: number;

  @Column({ name: 'range_to_nm', type: 'double precision' })
  rangeToNm: number;

  @Column({ type: 'boolean' })
  typical: boolean;

  @Column({ type: 'text' })
  source: string;

  @Column({ name: 'source_date', type: 'date', nullable: true })
  sourceDate: string | null;

  @Column({ name: 'process_notes', type: 'text' })
  processNotes: string;

  @CreateDateColumn({ name: 'superseded_at', type: 'timestamptz' })
  supersededAt: Date;

  @ManyToOne(() => User, { nullable: true, eager: true })
  @JoinColumn({ name: 'superseded_by_id' })
  supersededBy: User | null;
}

export type { MaterialRevisionView, MaterialView };

/** The content a material and its earlier revisions share, as the API shows it. */
function contentView(m: Material | MaterialRevision) {
  return {
    name: m.name,
    model: m.model,
    rangeNm: { from: m.rangeFromNm, to: m.rangeToNm },
    typical: m.typical,
    provenance: { source: m.source, date: m.sourceDate, notes: m.processNotes },
  };
}

export function toMaterialView(m: Material): MaterialView {
  return {
    id: m.id,
    revision: m.revision,
    ...contentView(m),
    version: m.version,
    updatedAt: m.updatedAt.toISOString(),
  };
}

export function toMaterialRevisionView(r: MaterialRevision): MaterialRevisionView {
  return {
    revision: r.revision,
    ...contentView(r),
    supersededAt: r.supersededAt.toISOString(),
    supersededBy: r.supersededBy?.displayName ?? null,
  };
}
