import { numericCell as numeric, readCsvRows, writeCsv } from '../common/csv.js';
import { LIMIT_BAND_FIELDS, type LimitBand } from '@quietglass/shared/optics/mask';
import type { CsvProblem } from '../common/csv.js';
import { MAX_MASK_CSV_BYTES } from '@quietglass/shared/schemas/spec-masks';

/** Columns of the spec-mask CSV, in export order: the limit band's own fields. `angles_deg` lists angles separated by `;`; an angle range fills angle_from_deg, angle_to_deg and angle_step_deg instead. */
export const MASK_CSV_COLUMNS = LIMIT_BAND_FIELDS;

const NUMBER_COLUMNS = new Set([
  'from_nm',
  'to_nm',
  'max_percent',
  'min_percent',
  'target_percent',
  'tolerance_percent',
  'margin_percent',
  'angle_from_deg',
  'angle_to_deg',
  'angle_step_deg',
  'weight',
  'step_nm',
]);
const REQUIRED = ['from_nm', 'to_nm', 'quantity'];

export type MaskCsvResult =
  { ok: true; bands: Record<string, unknown>[] } | { ok: false; problems: CsvProblem[] };

/**
 * Reads limit bands from CSV with a header row naming the columns of MASK_CSV_COLUMNS (any order;
 * from_nm, to_nm and quantity required). Cells are only parsed here; the engine's mask validation
 * then checks the bands' meaning. Every bad row is reported with its line number.
 */
export function parseMaskCsv(text: string): MaskCsvResult {
  const read = readCsvRows(text, MAX_MASK_CSV_BYTES, [',', '\t']);
  if (!read.ok) return read;
  const lines = read.lines;
  const [header, ...rows] = read.rows;
  if (header === undefined) return { ok: false, problems: [{ row: 0, reason: 'the file is empty' }] };
  const names = header.map((h) => h.trim().toLowerCase());
  const unknown = names.filter((n) => !(MASK_CSV_COLUMNS as readonly string[]).includes(n));
  const missing = REQUIRED.filter((r) => !names.includes(r));
  if (unknown.length > 0 || missing.length > 0) {
    const parts = [
      unknown.length > 0 ? `unknown column(s) ${unknown.join(', ')}` : '',
      missing.length > 0 ? `missing column(s) ${missing.join(', ')}` : '',
    ].filter(Boolean);
    return {
      ok: false,
      problems: [
        { row: 1, reason: `header: ${parts.join('; ')}; columns are ${MASK_CSV_COLUMNS.join(',')}` },
      ],
    };
  }
  if (rows.length === 0)
    return { ok: false, problems: [{ row: 0, reason: 'the file has a header but no limit band' }] };
  const problems: CsvProblem[] = [];
  const bands: Record<string, unknown>[] = [];
  rows.forEach((row, i) => {
    const line = lines[i + 1] ?? 0;
    if (row.length !== names.length) {
      problems.push({ row: line, reason: `has ${row.length} column(s), the header has ${names.length}` });
      return;
    }
    const band: Record<string, unknown> = {};
    const bad: string[] = [];
    names.forEach((name, c) => {
      const cell = (row[c] ?? '').trim();
      if (cell === '') return;
      if (NUMBER_COLUMNS.has(name)) {
        const v = numeric(cell);
        if (v === null) bad.push(`${name} "${cell}" is not a number`);
        else band[name] = v;
      } else if (name === 'angles_deg') {
        const parts = cell.split(/[;\s]+/).filter(Boolean);
        const values = parts.map(numeric);
        if (values.some((v) => v === null))
          bad.push(`angles_deg "${cell}" must be numbers separated by spaces or ;`);
        else band.angles_deg = values;
      } else {
        band[name] = cell;
      }
    });
    if (bad.length > 0) problems.push({ row: line, reason: bad.join('; ') });
    else bands.push(band);
  });
  return problems.length > 0 ? { ok: false, problems } : { ok: true, bands };
}

/** Writes limit bands in the same CSV form. */
export function maskToCsv(bands: readonly LimitBand[]): string {
  const rows = bands.map((b) =>
    MASK_CSV_COLUMNS.map((c) => {
      const v = (b as unknown as Record<string, unknown>)[c];
      if (v === undefined || v === null) return '';
      if (Array.isArray(v)) return v.join(';');
      return typeof v === 'number' ? v : typeof v === 'string' ? v : JSON.stringify(v);
    }),
  );
  return writeCsv(MASK_CSV_COLUMNS, rows);
}
