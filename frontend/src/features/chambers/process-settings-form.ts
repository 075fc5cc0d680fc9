import {
  PROCESS_LIMITS,
  PROCESS_NOTES_MAX,
  type ProcessQuantity,
  type ProcessSetting,
} from '@quietglass/shared';
import { parseNumberInput } from '../../lib/format';

/** The quantities of a row, in the order the dialog shows them, with their labels. */
export const PROCESS_FIELDS: readonly { key: ProcessQuantity; label: string; required: boolean }[] = [
  { key: 'substrateTemperatureC', label: 'Substrate temperature (°C)', required: true },
  { key: 'basePressureMbar', label: 'Base pressure (mbar)', required: true },
  { key: 'o2FlowSccm', label: 'O₂ flow (sccm)', required: false },
  { key: 'o2PartialPressureMbar', label: 'O₂ partial pressure (mbar)', required: false },
  { key: 'arFlowSccm', label: 'Ar flow (sccm)', required: false },
  { key: 'ionVoltageV', label: 'Ion source voltage (V)', required: false },
  { key: 'ionCurrentA', label: 'Ion source current (A)', required: false },
  { key: 'ionGasFlowSccm', label: 'Ion source gas (sccm)', required: false },
];

/** One row as typed: every quantity as text; an empty row keeps no setting for the material. */
export type ProcessRowValues = { materialId: number; notes: string } & Record<ProcessQuantity, string>;

export interface ProcessFormValues {
  rows: ProcessRowValues[];
}

const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

/** Whether a row keeps a setting: anything typed in it. */
export function rowIsKept(row: ProcessRowValues): boolean {
  return PROCESS_FIELDS.some((f) => row[f.key].trim() !== '') || row.notes.trim() !== '';
}

/** Rows for each of the chamber's materials, filled from the saved settings. */
export function valuesOfSettings(
  materialIds: readonly number[],
  settings: readonly ProcessSetting[],
): ProcessFormValues {
  return {
    rows: materialIds.map((materialId) => {
      const s = settings.find((x) => x.materialId === materialId);
      const row = { materialId, notes: s?.notes ?? '' } as ProcessRowValues;
      for (const f of PROCESS_FIELDS) row[f.key] = text(s?.[f.key]);
      return row;
    }),
  };
}

/**
 * Why a typed quantity cannot be saved, with the API's limits (shared/chambers); null when it can.
 * A required quantity may be empty only when the whole row is.
 */
export function processFieldError(key: ProcessQuantity, value: string, row: ProcessRowValues): string | null {
  const field = PROCESS_FIELDS.find((f) => f.key === key)!;
  const { min, max, unit } = PROCESS_LIMITS[key];
  if (value.trim() === '') return field.required && rowIsKept(row) ? 'Needed when the row is kept' : null;
  const n = parseNumberInput(value);
  if (n === null) return `A number in ${unit}`;
  if (n < min) return `At least ${min} ${unit}`;
  if (n > max) return `At most ${max} ${unit}`;
  return null;
}

export function notesError(value: string): string | null {
  return value.trim().length > PROCESS_NOTES_MAX ? `At most ${PROCESS_NOTES_MAX} characters` : null;
}

/** The settings to send: kept rows only, empty optional quantities as null. */
export function settingsOf(values: ProcessFormValues): ProcessSetting[] {
  return values.rows.filter(rowIsKept).map((row) => {
    const num = (k: ProcessQuantity) => (row[k].trim() === '' ? null : Number(parseNumberInput(row[k])));
    return {
      materialId: row.materialId,
      substrateTemperatureC: Number(parseNumberInput(row.substrateTemperatureC)),
      basePressureMbar: Number(parseNumberInput(row.basePressureMbar)),
      o2FlowSccm: num('o2FlowSccm'),
      o2PartialPressureMbar: num('o2PartialPressureMbar'),
      arFlowSccm: num('arFlowSccm'),
      ionVoltageV: num('ionVoltageV'),
      ionCurrentA: num('ionCurrentA'),
      ionGasFlowSccm: num('ionGasFlowSccm'),
      notes: row.notes.trim(),
    };
  });
}
