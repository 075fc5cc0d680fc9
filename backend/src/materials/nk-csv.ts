import { numericCell as cell, readCsvRows, type CsvProblem } from '../common/csv.js';

/** Largest n,k file accepted (bytes of text). */
export const MAX_NK_CSV_BYTES = 1_000_000;

export type WavelengthUnit = 'nm' | 'um';

export interface NkTable {
  /** Wavelengths in nm, strictly increasing. */
  wavelengths: number[];
  n: number[];
  k: number[];
}

export type { CsvProblem };

export type NkCsvResult =
  { ok: true; table: NkTable; headerRow: boolean } | { ok: false; problems: CsvProblem[] };

const WAVELENGTH_NAMES = /^(wavelength|wl|lambda|λ)(_?\(?(nm|um|µm|micron)\)?)?$/i;
const N_NAMES = /^n$/i;
const K_NAMES = /^(k|kappa)$/i;

/**
 * Parses an n,k table: columns wavelength, n and (optionally) k, comma-, semicolon- or
 * tab-separated, with or without a header row (a header names the columns in any order, e.g.
 * `wavelength_nm,n,k`). Every bad row is reported with its line number and reason; nothing is
 * returned unless the whole file is valid.
 */
export function parseNkCsv(text: string, unit: WavelengthUnit): NkCsvResult {
  const read = readCsvRows(text, MAX_NK_CSV_BYTES);
  if (!read.ok) return read;
  const rows = read.rows;
  const lineOf = read.lines;
  const problems: CsvProblem[] = [];

  let columns = { wl: 0, n: 1, k: 2 as number | null };
  let first = 0;
  const head = rows[0] ?? [];
  // A header row has no number in it; a data row with a bad cell still has its wavelength.
  const headerRow = head.every((c) => cell(c) === null);
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
            row: lineOf[0],
            reason: `the header "${names.join(',')}" must name a wavelength column (e.g. wavelength_nm) and an n column; k is optional`,
          },
        ],
      };
    }
    columns = { wl, n, k: k >= 0 ? k : null };
  } else if (head.length < 2) {
    return {
      ok: false,
      problems: [{ row: lineOf[0], reason: 'expected 2 or 3 columns: wavelength, n and optionally k' }],
    };
  } else if (head.length === 2) {
    columns = { wl: 0, n: 1, k: null };
  }

  const table: NkTable = { wavelengths: [], n: [], k: [] };
  let previous = -Infinity;
  for (let i = first; i < rows.length; i += 1) {
    const line = lineOf[i];
    const row = rows[i];
    if (row.length !== head.length) {
      problems.push({ row: line, reason: `has ${row.length} column(s), the file has ${head.length}` });
      continue;
    }
    const wl = cell(row[columns.wl]);
    const n = cell(row[columns.n]);
    const k = columns.k === null ? 0 : cell(row[columns.k]);
    if (wl === null || n === null || k === null) {
      const bad = [
        wl === null ? `wavelength "${row[columns.wl].trim()}"` : null,
        n === null ? `n "${row[columns.n].trim()}"` : null,
        k === null && columns.k !== null ? `k "${row[columns.k].trim()}"` : null,
      ].filter(Boolean);
      problems.push({ row: line, reason: `not a number: ${bad.join(', ')}` });
      continue;
    }
    const nm = unit === 'um' ? wl * 1000 : wl;
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
  if (problems.length === 0 && unit === 'nm' && table.wavelengths[table.wavelengths.length - 1] < 20) {
    problems.push({ row: 0, reason: 'the wavelengths look like µm (all below 20); choose µm as the unit' });
  }
  if (problems.length === 0 && unit === 'um' && table.wavelengths[0] > 20_000) {
    problems.push({
      row: 0,
      reason: 'the wavelengths look like nm (all above 20 µm); choose nm as the unit',
    });
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, table, headerRow };
}
