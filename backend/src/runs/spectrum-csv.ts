import { numericCell, readCsvRows, type CsvProblem } from '../common/csv.js';

export const MAX_SPECTRUM_CSV_BYTES = 2_000_000;

export interface ParsedSpectrum {
  quantity: 'R' | 'T';
  wavelengthsNm: number[];
  valuesPercent: number[];
}

export type SpectrumCsvResult =
  { ok: true; spectrum: ParsedSpectrum } | { ok: false; problems: CsvProblem[] };

const WAVELENGTH = /^wavelength_?\(?nm\)?$/i;
const VALUE = /^(R|T)_?\(?(percent|%)\)?$/i;

/**
 * A measured spectrum as spectrophotometers export it: a header naming `wavelength_nm` and one of
 * `R_percent` or `T_percent` (other columns are ignored), then one row per wavelength in increasing
 * order. Every bad row is reported; nothing is accepted unless the whole file is valid.
 */
export function parseSpectrumCsv(text: string): SpectrumCsvResult {
  const read = readCsvRows(text, MAX_SPECTRUM_CSV_BYTES);
  if (!read.ok) return read;
  const [header, ...rows] = read.rows;
  const names = header.map((h) => h.trim());
  const wl = names.findIndex((n) => WAVELENGTH.test(n));
  const valueColumns = names.map((n, i) => ({ i, m: VALUE.exec(n) })).filter((c) => c.m);
  if (wl < 0 || valueColumns.length !== 1) {
    const why =
      wl < 0
        ? 'no wavelength_nm column'
        : valueColumns.length === 0
          ? 'no R_percent or T_percent column'
          : 'both R_percent and T_percent: upload one quantity per file';
    return {
      ok: false,
      problems: [
        {
          row: read.lines[0],
          reason: `header "${names.join(',')}": ${why} (expected e.g. wavelength_nm,R_percent)`,
        },
      ],
    };
  }
  const vc = valueColumns[0].i;
  const quantity = (valueColumns[0].m as RegExpExecArray)[1].toUpperCase() as 'R' | 'T';
  if (rows.length < 2)
    return { ok: false, problems: [{ row: 0, reason: 'at least 2 data rows are needed' }] };
  const problems: CsvProblem[] = [];
  const spectrum: ParsedSpectrum = { quantity, wavelengthsNm: [], valuesPercent: [] };
  let previous = -Infinity;
  rows.forEach((row, i) => {
    const line = read.lines[i + 1];
    if (row.length !== header.length) {
      problems.push({ row: line, reason: `has ${row.length} column(s), the header has ${header.length}` });
      return;
    }
    const x = numericCell(row[wl]);
    const y = numericCell(row[vc]);
    if (x === null || y === null) {
      const bad = [
        x === null ? `wavelength "${row[wl].trim()}"` : '',
        y === null ? `${quantity} "${row[vc].trim()}"` : '',
      ]
        .filter(Boolean)
        .join(', ');
      problems.push({ row: line, reason: `not a number: ${bad}` });
      return;
    }
    const reasons: string[] = [];
    if (!(x > 0)) reasons.push('wavelength must be > 0');
    if (y < 0 || y > 100) reasons.push(`${quantity} must lie between 0 and 100 percent (got ${y})`);
    if (x > 0 && x <= previous)
      reasons.push(`wavelength ${x} nm does not increase (previous row ${previous} nm)`);
    if (x > previous) previous = x;
    if (reasons.length > 0) {
      problems.push({ row: line, reason: reasons.join('; ') });
      return;
    }
    spectrum.wavelengthsNm.push(x);
    spectrum.valuesPercent.push(y);
  });
  if (problems.length === 0 && spectrum.wavelengthsNm[spectrum.wavelengthsNm.length - 1] < 100) {
    problems.push({ row: 0, reason: 'the wavelengths look like µm (all below 100); the file must give nm' });
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, spectrum };
}
