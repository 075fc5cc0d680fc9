import { MAX_NK_CSV_BYTES } from '@quietglass/shared/materials';
import { numericCell as plainCell, readCsvRows, type CsvProblem } from '../common/csv.js';

export { MAX_NK_CSV_BYTES };

export type WavelengthUnit = 'nm' | 'um';

export interface NkTable {
  /** Wavelengths in nm, strictly increasing. */
  wavelengths: number[];
  n: number[];
  k: number[];
}

export type { CsvProblem };

export type NkCsvResult =
  | { ok: true; table: NkTable; headerRow: boolean; unit: WavelengthUnit; decimalComma: boolean }
  | { ok: false; problems: CsvProblem[] };

/**
 * A wavelength column's name, with or without its unit: `wavelength_nm`, `Wavelength (nm)`,
 * `wavelength [µm]`, `λ/nm`, `wl um`.
 */
const WAVELENGTH_NAMES =
  /^(wavelength|wave length|wl|lambda|λ)\s*(?:[_/,]\s*|\s)?[([]?\s*(nm|um|µm|μm|microns?|micrometres?|micrometers?|nanometres?|nanometers?)?\s*[)\]]?$/i;
/** n and k columns, optionally with a unitless mark: `n`, `n (-)`, `k [1]`. */
const N_NAMES = /^(n|index|refractive index)\s*([([]\s*(-|1)?\s*[)\]])?$/i;
const K_NAMES = /^(k|kappa|extinction( coefficient)?)\s*([([]\s*(-|1)?\s*[)\]])?$/i;

function unitOfName(name: string): WavelengthUnit | null {
  const unit = WAVELENGTH_NAMES.exec(name)?.[2]?.toLowerCase();
  if (!unit) return null;
  return unit.startsWith('n') ? 'nm' : 'um';
}

/** A cell with a decimal comma ("1,4567") read as a number where the delimiter is not a comma. */
function decimalCommaCell(value: string): number | null {
  const t = value.trim();
  return /^[+-]?\d+,\d+([eE][+-]?\d+)?$/.test(t) ? Number(t.replace(',', '.')) : null;
}

/**
 * Parses an n,k table: columns wavelength, n and (optionally) k, comma-, semicolon- or
 * tab-separated, with or without a header row (a header names the columns in any order, e.g.
 * `wavelength_nm,n,k` or `Wavelength (µm);n;k`). Semicolon- and tab-separated files may use
 * decimal commas. A unit in the header decides nm or µm; `unit` is used when the header names
 * none (and must agree with it when both are given). Every bad row is reported with its line number
 * and reason; nothing is returned unless the whole file is valid.
 */
export function parseNkCsv(text: string, requestedUnit: WavelengthUnit | null): NkCsvResult {
  const read = readCsvRows(text, MAX_NK_CSV_BYTES);
  if (!read.ok) return read;
  const rows = read.rows;
  const commaDecimals = read.delimiter !== ',';
  const seen = { decimalComma: false };
  const cell = (value: string): number | null => {
    const plain = plainCell(value);
    if (plain !== null || !commaDecimals) return plain;
    const comma = decimalCommaCell(value);
    if (comma !== null) seen.decimalComma = true;
    return comma;
  };
  let unit: WavelengthUnit | null = requestedUnit;
  const lineOf = (index: number): number => read.lines[index] ?? 0;
  const problems: CsvProblem[] = [];

  let columns = { wl: 0, n: 1, k: 2 as number | null };
  let first = 0;
  const head = rows[0] ?? [];
  // A header row has no number in it; a data row with a bad cell still has its wavelength.
  const headerRow = head.every((c) => cell(c) === null);
  seen.decimalComma = false;
  if (headerRow) {
    first = 1;
    const names = head.map((c) => c.trim());
    const wl = names.findIndex((c) => WAVELENGTH_NAMES.test(c));
    const n = names.findIndex((c) => N_NAMES.test(c));
    const k = names.findIndex((c) => K_NAMES.test(c));
    if (wl < 0 || n < 0) {
      return {
        ok: false,
        problems: [
          {
            row: lineOf(0),
            reason: `the header "${names.join(',')}" must name a wavelength column (e.g. wavelength_nm) and an n column; k is optional`,
          },
        ],
      };
    }
    columns = { wl, n, k: k >= 0 ? k : null };
    const named = unitOfName(names[wl] ?? '');
    if (named && requestedUnit && named !== requestedUnit) {
      return {
        ok: false,
        problems: [
          {
            row: lineOf(0),
            reason: `the header gives the wavelengths in ${named === 'um' ? 'µm' : 'nm'}, but ${requestedUnit === 'um' ? 'µm' : 'nm'} was chosen`,
          },
        ],
      };
    }
    unit = named ?? requestedUnit;
  } else if (head.length < 2) {
    return {
      ok: false,
      problems: [{ row: lineOf(0), reason: 'expected 2 or 3 columns: wavelength, n and optionally k' }],
    };
  } else if (head.length === 2) {
    columns = { wl: 0, n: 1, k: null };
  }

  if (unit === null) {
    return {
      ok: false,
      problems: [
        {
          row: 0,
          reason: 'the header names no wavelength unit; choose nm or µm (or name it, e.g. "Wavelength (nm)")',
        },
      ],
    };
  }
  const table: NkTable = { wavelengths: [], n: [], k: [] };
  let previous = -Infinity;
  for (const [i, row] of rows.entries()) {
    if (i < first) continue;
    const line = lineOf(i);
    const text = (index: number): string => row[index] ?? '';
    if (row.length !== head.length) {
      problems.push({ row: line, reason: `has ${row.length} column(s), the file has ${head.length}` });
      continue;
    }
    const wl = cell(text(columns.wl));
    const n = cell(text(columns.n));
    const k = columns.k === null ? 0 : cell(text(columns.k));
    if (wl === null || n === null || k === null) {
      const bad = [
        wl === null ? `wavelength "${text(columns.wl).trim()}"` : null,
        n === null ? `n "${text(columns.n).trim()}"` : null,
        k === null && columns.k !== null ? `k "${text(columns.k).trim()}"` : null,
      ].filter(Boolean);
      problems.push({ row: line, reason: `not a number: ${bad.join(', ')}` });
      continue;
    }
    const nm = unit === 'um' ? Number((wl * 1000).toFixed(6)) : wl;
    const rowProblems: string[] = [];
    if (!(nm > 0)) rowProblems.push('wavelength must be > 0');
    if (!(n > 0)) rowProblems.push('n must be > 0');
    if (!(k >= 0)) rowProblems.push('k must be ≥ 0 (k > 0 is absorption)');
    if (nm > 0 && nm <= previous)
      rowProblems.push(`wavelength ${nm} nm does not increase (previous row ${previous} nm)`);
    if (rowProblems.length > 0) {
      problems.push({ row: line, reason: rowProblems.join('; ') });
      if (nm > previous) previous = nm;
      continue;
    }
    previous = nm;
    table.wavelengths.push(nm);
    table.n.push(n);
    table.k.push(k);
  }
  if (problems.length === 0 && table.wavelengths.length < 2) {
    problems.push({ row: 0, reason: 'at least 2 data rows are needed' });
  }
  const shortest = table.wavelengths[0];
  const longest = table.wavelengths.at(-1);
  if (problems.length === 0 && unit === 'nm' && longest !== undefined && longest < 20) {
    problems.push({ row: 0, reason: 'the wavelengths look like µm (all below 20); choose µm as the unit' });
  }
  if (problems.length === 0 && unit === 'um' && shortest !== undefined && shortest > 20_000) {
    problems.push({
      row: 0,
      reason: 'the wavelengths look like nm (all above 20 µm); choose nm as the unit',
    });
  }
  return problems.length > 0
    ? { ok: false, problems }
    : { ok: true, table, headerRow, unit, decimalComma: seen.decimalComma };
}
