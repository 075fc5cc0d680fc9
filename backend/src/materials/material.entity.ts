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
import type { MaterialRevisionView, MaterialView, ProvenanceKind } from '@quietglass/shared/materials';
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

  @Column({ name: 'provenance_kind', type: 'varchar', length: 10, default: 'published' })
  provenanceKind: ProvenanceKind;

  @Column({ name: 'provenance_run', type: 'varchar', length: 120, default: '' })
  provenanceRun: string;

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

  /** Retired: hidden from pickers, kept for the versions that use it. */
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true })
  retiredAt: Date | null;

  /** The file it was imported from (its bytes live in material_source_files). */
  @Column({ name: 'source_file_name', type: 'varchar', length: 255, nullable: true })
  sourceFileName: string | null;

  @Column({ name: 'source_file_type', type: 'varchar', length: 100, nullable: true })
  sourceFileType: string | null;

  @Column({ name: 'source_file_bytes', type: 'integer', nullable: true })
  sourceFileBytes: number | null;

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

  @Column({ name: 'provenance_kind', type: 'varchar', length: 10 })
  provenanceKind: ProvenanceKind;

  @Column({ name: 'provenance_run', type: 'varchar', length: 120 })
  provenanceRun: string;

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
    provenance: {
      kind: m.provenanceKind,
      source: m.source,
      date: m.sourceDate,
      run: m.provenanceRun,
      notes: m.processNotes,
    },
  };
}

export function toMaterialView(m: Material): MaterialView {
  return {
    id: m.id,
    revision: m.revision,
    ...contentView(m),
    retiredAt: m.retiredAt?.toISOString() ?? null,
    sourceFile:
      m.sourceFileName === null
        ? null
        : {
            fileName: m.sourceFileName,
            mediaType: m.sourceFileType ?? 'application/octet-stream',
            sizeBytes: m.sourceFileBytes ?? 0,
          },
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
