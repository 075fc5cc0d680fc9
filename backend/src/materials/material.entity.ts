import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import type { MaterialModel } from '@quietglass/shared/optics/dispersion';

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

  @VersionColumn()
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

export interface MaterialView {
  id: number;
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  typical: boolean;
  provenance: { source: string; date: string | null; notes: string };
  version: number;
  updatedAt: string;
}

export function toMaterialView(m: Material): MaterialView {
  return {
    id: m.id,
    name: m.name,
    model: m.model,
    rangeNm: { from: m.rangeFromNm, to: m.rangeToNm },
    typical: m.typical,
    provenance: { source: m.source, date: m.sourceDate, notes: m.processNotes },
    version: m.version,
    updatedAt: m.updatedAt.toISOString(),
  };
}
