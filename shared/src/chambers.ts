/*
 * Coating chambers as the API and the client exchange them.
 */

/** One material's setting in a chamber. */
export interface ChamberMaterialSetting {
  materialId: number;
  /** Thickness on the part ÷ thickness on the monitor. */
  toolingFactor: number;
  /** Default deposition rate at the monitor, nm/s. */
  rateNmPerS: number;
}

/** A coating chamber: tooling factors and rates per material, and its optical monitor. */
export interface ChamberView {
  id: number;
  name: string;
  monitorWavelengthsNm: number[];
  /** Material of the optical monitor's witness chip. */
  monitorChipMaterialId: number;
  materials: ChamberMaterialSetting[];
  notes: string;
  /** Optimistic-locking counter: send it back with an edit. */
  version: number;
  updatedAt: string;
}
