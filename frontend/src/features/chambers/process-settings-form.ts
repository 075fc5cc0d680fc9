import { processSettingSchema, type ProcessQuantity, type ProcessSetting } from '@quietglass/shared';
import { z } from 'zod';
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

/** A kept row as the API's schema reads it: an empty optional quantity is null, an empty required one missing. */
function requestRow(row: ProcessRowValues): Record<string, unknown> {
  const out: Record<string, unknown> = { materialId: row.materialId, notes: row.notes };
  for (const f of PROCESS_FIELDS) {
    const text = row[f.key];
    out[f.key] =
      text.trim() === '' ? (f.required ? undefined : null) : (parseNumberInput(text) ?? Number.NaN);
  }
  return out;
}

/**
 * The dialog's rows checked by the API's own process settings schema: kept rows only, parsed from
 * their typed text, with the API's limits and messages at each field.
 */
export const processFormSchema = z
  .object({
    rows: z.array(
      z
        .custom<ProcessRowValues>()
        .transform((row) => (rowIsKept(row) ? requestRow(row) : null))
        .pipe(processSettingSchema.nullable()),
    ),
  })
  .transform(({ rows }) => ({ settings: rows.filter((row) => row !== null) }));
export type ProcessFormOutput = z.output<typeof processFormSchema>;
