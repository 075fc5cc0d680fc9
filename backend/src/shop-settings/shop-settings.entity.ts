import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { LogoType } from '@quietglass/shared/shop';

/**
 * The shop's name and logo for document headers and its design defaults: a single row (id 1),
 * written on first save.
 */
@Entity({ name: 'shop_settings' })
export class ShopSettings {
  @PrimaryColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'shop_name', type: 'varchar', length: 120 })
  shopName: string;

  @Column({ type: 'bytea', nullable: true, select: false })
  logo: Buffer | null;

  @Column({ name: 'logo_type', type: 'varchar', length: 32, nullable: true })
  logoType: LogoType | null;

  /** Default target margin of Fit to mask and Grow layers, percentage points; null: the engine's. */
  @Column({ name: 'target_margin_percent', type: 'double precision', nullable: true })
  targetMarginPercent: number | null;

  @Column({ type: 'integer' })
  version: number;

  @Column({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
