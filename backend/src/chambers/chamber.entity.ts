import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';

export interface ChamberMaterialSetting {
  materialId: number;
  /** Thickness on the part ÷ thickness on the monitor. */
  toolingFactor: number;
  /** Default deposition rate at the monitor, nm/s. */
  rateNmPerS: number;
}

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

export type ChamberView = Omit<Chamber, 'createdAt' | 'updatedAt'> & { updatedAt: string };

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
