import type { DesignLayer, DesignVersionView, LimitBand, NamedModel } from '@quietglass/shared';
import type { TableLayer } from '../results';

/** What the result views need of the version the optimisation started from. */
export interface VersionContext {
  version: DesignVersionView;
  /** Material models by id: the version's frozen snapshot, else the library. */
  materials: ReadonlyMap<number, NamedModel>;
  /** Library material ids by name (Grow layers names its materials). */
  idsByName: ReadonlyMap<string, number>;
  maskBands: LimitBand[] | null;
}

export function tableLayers(layers: readonly DesignLayer[], context: VersionContext): TableLayer[] {
  return layers.map((l) => ({
    material: context.materials.get(l.materialId)?.name ?? `material ${l.materialId}`,
    thicknessNm: l.thicknessNm,
  }));
}
