import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import type { ChamberMaterialSetting, ChamberView } from '@quietglass/shared/chambers';

/** A coating chamber: its tooling factors and rates per material, and its optical monitor. */
@Entity({ name: 'chambers' })
export class Chamber {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 120, unique: true })
  name: string;

  @Column({ name: 'monitor_wavelengths_nm', type: 'jsonb' })
  monitorWavelengthsNm: number[];

  /** Material of the optical monitor's witness chip. */
  @Column({ name: 'monitor_chip_material_id', type: 'integer' })
  monitorChipMaterialId: number;

  @Column({ type: 'jsonb' })
  materials: ChamberMaterialSetting[];

  @Column({ type: 'text', default: '' })
  notes: string;

  @VersionColumn()
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

export function toChamberView(c: Chamber): ChamberView {
  return {
    id: c.id,
    name: c.name,
    monitorWavelengthsNm: c.monitorWavelengthsNm,
    monitorChipMaterialId: c.monitorChipMaterialId,
    materials: c.materials,
    notes: c.notes,
    version: c.version,
    updatedAt: c.updatedAt.toISOString(),
  };
}
