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

/**
 * A tooling factor as shown and printed: three decimals, more where the stored factor has them
 * (a calibration sets four), so a sheet never shows a rounded factor beside a thickness computed
 * with the exact one.
 */
export function formatToolingFactor(factor: number): string {
  for (let decimals = 3; decimals < 6; decimals++) {
    const text = factor.toFixed(decimals);
    if (Number(text) === factor) return text;
  }
  return factor.toFixed(6);
}

/** Material id (as a JSON key) → tooling factor: what a run keeps of its chamber when logged. */
export type ToolingFactorsKept = Record<string, number>;

/** The tooling factors a run keeps of its chamber's materials. */
export function keptToolingFactors(materials: readonly ChamberMaterialSetting[]): ToolingFactorsKept {
  return Object.fromEntries(materials.map((m) => [String(m.materialId), m.toolingFactor]));
}

/** The factor a run kept for a material, or undefined when it kept none. */
export function keptToolingFactor(
  kept: ToolingFactorsKept | null | undefined,
  materialId: number,
): number | undefined {
  return kept?.[String(materialId)];
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

/**
 * Limits of a process setting, written once for the API, the Chambers page and the run sheet. Wide
 * enough for evaporation with or without ion assist; they catch typing slips (a base pressure in
 * Pa typed as mbar, a temperature in K), not process choices — common practice (no source).
 */
export const PROCESS_LIMITS = {
  substrateTemperatureC: { min: 0, max: 400, unit: '°C' },
  basePressureMbar: { min: 1e-9, max: 1e-3, unit: 'mbar' },
  o2FlowSccm: { min: 0, max: 500, unit: 'sccm' },
  o2PartialPressureMbar: { min: 1e-7, max: 1e-2, unit: 'mbar' },
  arFlowSccm: { min: 0, max: 500, unit: 'sccm' },
  ionVoltageV: { min: 0, max: 2000, unit: 'V' },
  ionCurrentA: { min: 0, max: 20, unit: 'A' },
  ionGasFlowSccm: { min: 0, max: 200, unit: 'sccm' },
} as const;
export type ProcessQuantity = keyof typeof PROCESS_LIMITS;

/** Longest note a process setting may carry. */
export const PROCESS_NOTES_MAX = 300;

/**
 * How one material is deposited in one chamber, besides its tooling factor and rate (those stay
 * in the chamber's material list). Null: not used for this material (no O₂ backfill, no ion assist).
 */
export interface ProcessSetting {
  materialId: number;
  /** Substrate temperature during deposition, °C. */
  substrateTemperatureC: number;
  /** Pressure to reach before the material is started, mbar. */
  basePressureMbar: number;
  /** Reactive O₂ backfill: a flow, a partial pressure to hold, both or neither. */
  o2FlowSccm: number | null;
  o2PartialPressureMbar: number | null;
  arFlowSccm: number | null;
  /** Ion-assist source: discharge or beam voltage, current, and its gas flow. */
  ionVoltageV: number | null;
  ionCurrentA: number | null;
  ionGasFlowSccm: number | null;
  notes: string;
}

/** A chamber's process settings, one per material; `version` guards concurrent edits. */
export interface ProcessSettingsView {
  chamberId: number;
  settings: ProcessSetting[];
  /** Optimistic-locking counter: 0 before the first save; send it back with an edit. */
  version: number;
  updatedAt: string | null;
}

/** What a pressure looks like on a run sheet or the Chambers page: 2.0 × 10⁻⁵ mbar. */
export function formatPressureMbar(p: number): string {
  const exponent = Math.floor(Math.log10(p));
  let mantissa = p / 10 ** exponent;
  let e = exponent;
  if (Number(mantissa.toFixed(1)) >= 10) {
    mantissa /= 10;
    e += 1;
  }
  const sup: Record<string, string> = {
    '-': '⁻',
    '0': '⁰',
    '1': '¹',
    '2': '²',
    '3': '³',
    '4': '⁴',
    '5': '⁵',
    '6': '⁶',
    '7': '⁷',
    '8': '⁸',
    '9': '⁹',
  };
  const power = String(e)
    .split('')
    .map((c) => sup[c])
    .join('');
  return `${mantissa.toFixed(1)} × 10${power} mbar`;
}

/**
 * A process setting as short lines for a run sheet cell: temperature, base pressure, gases, ion
 * assist and the note, leaving out what is not used.
 */
export function processLines(s: ProcessSetting): string[] {
  const lines = [
    `Substrate at ${s.substrateTemperatureC} °C`,
    `Base pressure ≤ ${formatPressureMbar(s.basePressureMbar)}`,
  ];
  const o2: string[] = [];
  if (s.o2FlowSccm !== null) o2.push(`${s.o2FlowSccm} sccm`);
  if (s.o2PartialPressureMbar !== null)
    o2.push(`${formatPressureMbar(s.o2PartialPressureMbar)} partial pressure`);
  if (o2.length > 0) lines.push(`O₂ ${o2.join(', ')}`);
  if (s.arFlowSccm !== null) lines.push(`Ar ${s.arFlowSccm} sccm`);
  const ion: string[] = [];
  if (s.ionVoltageV !== null) ion.push(`${s.ionVoltageV} V`);
  if (s.ionCurrentA !== null) ion.push(`${s.ionCurrentA} A`);
  if (s.ionGasFlowSccm !== null) ion.push(`gas ${s.ionGasFlowSccm} sccm`);
  lines.push(ion.length > 0 ? `Ion assist ${ion.join(', ')}` : 'No ion assist');
  if (s.notes) lines.push(s.notes);
  return lines;
}
