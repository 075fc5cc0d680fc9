import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { ProcessSetting } from '@quietglass/shared/chambers';

/**
 * A chamber's process settings per material (temperature, base pressure, gases, ion assist), kept
 * as one record per chamber so the whole set is saved, versioned and audited together.
 */
@Entity({ name: 'chamber_process_settings' })
export class ChamberProcessSettings {
  @PrimaryColumn({ name: 'chamber_id', type: 'integer' })
  chamberId: number;

  @Column({ type: 'jsonb' })
  settings: ProcessSetting[];

  @Column({ type: 'integer' })
  version: number;

  @Column({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
