import { MAX_SPECTRUM_CSV_BYTES, type SpectrumQuantity } from '@quietglass/shared/runs';
import { numericCell, readCsvRows, type CsvProblem } from '../common/csv.js';

export { MAX_SPECTRUM_CSV_BYTES };

export interface ParsedSpectrum {
  quantity: SpectrumQuantity;
  wavelengthsNm: number[];
  valuesPercent: number[];
}

export type SpectrumCsvResult =
  { ok: true; spectrum: ParsedSpectrum } | { ok: false; problems: CsvProblem[] };

export interface SpectrumCsvOptions {
  /** The measurement's angle of incidence: picks the rows of a file with an `angle_deg` column. */
  angleDeg?: number;
  /** The quantity to read from a file that holds both R and T (e.g. `npm run calc` output). */
  quantity?: SpectrumQuantity;
}

const WAVELENGTH = /^wavelength_?\(?nm\)?$/i;
/** `R_percent`, `R (%)`, `T%` …: values in percent. */
const PERCENT = /^(R|T)[ _]?\(?(percent|%)\)?$/i;
/** `R`, `T`, `R_fraction` …: values as fractions 0–1, as the calculation CLI writes them. */
const FRACTION = /^(R|T)([ _]?\(?fraction\)?)?$/i;
const ANGLE = /^angle(_deg|[ _]?\((deg|°)\))?$/i;
const POLARISATION = /^pol(ari[sz]ation)?$/i;

interface ValueColumn {
  index: number;
  quantity: SpectrumQuantity;
  /** Factor to percent: 1 for percent columns, 100 for fractions. */
  scale: 1 | 100;
}

function valueColumns(names: string[]): ValueColumn[] {
  const found: ValueColumn[] = [];
  names.forEach((n, index) => {
    const percent = PERCENT.exec(n);
    const fraction = percent ? null : FRACTION.exec(n);
    const letter = (percent ?? fraction)?.[1];
    if (letter !== undefined)
      found.push({ index, quantity: letter.toUpperCase() as SpectrumQuantity, scale: percent ? 1 : 100 });
  });
  return found;
}

const headerProblem = (line: number, names: string[], why: string): SpectrumCsvResult => ({
  ok: false,
  problems: [
    { row: line, reason: `header "${names.join(',')}": ${why} (expected e.g. wavelength_nm,R_percent)` },
  ],
});

/**
 * A measured spectrum as spectrophotometers export it: a header naming `wavelength_nm` and one of
 * `R_percent` or `T_percent` (other columns are ignored), then one row per wavelength in increasing
 * order. The calculation CLI's output (`wavelength_nm,angle_deg,pol,R,T,A`, fractions 0–1) is read
 * too: the rows at the measurement's angle, the average polarisation where the file holds several,
 * and the quantity asked for where it holds both R and T. Every bad row is reported; nothing is
 * accepted unless the whole file is valid.
 */
export function parseSpectrumCsv(text: string, options: SpectrumCsvOptions = {}): SpectrumCsvResult {
  const read = readCsvRows(text, MAX_SPECTRUM_CSV_BYTES);
  if (!read.ok) return read;
  const [header, ...rows] = read.rows;
  const headerLine = read.lines[0] ?? 0;
  if (header === undefined) return { ok: false, problems: [{ row: 0, reason: 'the file is empty' }] };
  const names = header.map((h) => h.trim());
  const wl = names.findIndex((n) => WAVELENGTH.test(n));
  if (wl < 0) return headerProblem(headerLine, names, 'no wavelength_nm column');
  const columns = valueColumns(names);
  const quantities = [...new Set(columns.map((c) => c.quantity))];
  const [firstQuantity] = quantities;
  if (firstQuantity === undefined)
    return headerProblem(headerLine, names, 'no R_percent or T_percent column');
  let quantity: SpectrumQuantity;
  if (options.quantity !== undefined) {
    if (!quantities.includes(options.quantity))
      return headerProblem(headerLine, names, `no ${options.quantity} column`);
    quantity = options.quantity;
  } else if (quantities.length > 1) {
    return headerProblem(
      headerLine,
      names,
      'both R and T columns: choose the quantity to upload, or upload one quantity per file',
    );
  } else quantity = firstQuantity;
  const chosen = columns.filter((c) => c.quantity === quantity);
  const [valueColumn, ...extra] = chosen;
  if (valueColumn === undefined)
    throw new Error(`spectrum CSV: no ${quantity} column after the header check`);
  if (extra.length > 0) return headerProblem(headerLine, names, `more than one ${quantity} column`);
  const { index: vc, scale } = valueColumn;
  const angleColumn = names.findIndex((n) => ANGLE.test(n));
  const polColumn = names.findIndex((n) => POLARISATION.test(n));

  const problems: CsvProblem[] = [];
  interface Row {
    line: number;
    x: number;
    y: number;
    angle: number | null;
    pol: string | null;
  }
  const parsed: Row[] = [];
  rows.forEach((row, i) => {
    const line = read.lines[i + 1] ?? 0;
    if (row.length !== header.length) {
      problems.push({ row: line, reason: `has ${row.length} column(s), the header has ${header.length}` });
      return;
    }
    const cell = (index: number): string => row[index] ?? '';
    const x = numericCell(cell(wl));
    const y = numericCell(cell(vc));
    const angle = angleColumn < 0 ? null : numericCell(cell(angleColumn));
    if (x === null || y === null || (angleColumn >= 0 && angle === null)) {
      const bad = [
        x === null ? `wavelength "${cell(wl).trim()}"` : '',
        y === null ? `${quantity} "${cell(vc).trim()}"` : '',
        angleColumn >= 0 && angle === null ? `angle "${cell(angleColumn).trim()}"` : '',
      ]
        .filter(Boolean)
        .join(', ');
      problems.push({ row: line, reason: `not a number: ${bad}` });
      return;
    }
    parsed.push({ line, x, y, angle, pol: polColumn < 0 ? null : cell(polColumn).trim().toLowerCase() });
  });
  // A file-level problem with the rows' selection comes after the row problems found so far.
  const fail = (reason: string): SpectrumCsvResult => ({
    ok: false,
    problems: [...problems, { row: 0, reason }],
  });
  let selected = parsed;
  if (angleColumn >= 0) {
    const angles = [...new Set(parsed.map((r) => r.angle as number))];
    const at = options.angleDeg ?? (angles.length === 1 ? angles[0] : undefined);
    if (at === undefined)
      return {
        ok: false,
        problems: [
          { row: 0, reason: `the file holds angles ${angles.join(', ')}°: say which one was measured` },
        ],
      };
    selected = parsed.filter((r) => Math.abs((r.angle as number) - at) < 1e-9);
    if (selected.length === 0 && parsed.length > 0)
      return fail(`no rows at ${at}°; the file holds angles ${angles.join(', ')}°`);
  }
  if (polColumn >= 0) {
    const pols = [...new Set(selected.map((r) => r.pol as string))];
    if (pols.length > 1) {
      if (!pols.includes('avg'))
        return fail(`the file holds polarisations ${pols.join(', ')}: upload one, or avg`);
      selected = selected.filter((r) => r.pol === 'avg');
    }
  }
  if (selected.length < 2 && problems.length === 0) return fail('at least 2 data rows are needed');

  const spectrum: ParsedSpectrum = { quantity, wavelengthsNm: [], valuesPercent: [] };
  const top = scale === 1 ? '100 percent' : '1 (the column is a fraction)';
  let previous = -Infinity;
  for (const { line, x, y } of selected) {
    const reasons: string[] = [];
    if (!(x > 0)) reasons.push('wavelength must be > 0');
    if (y < 0 || y * scale > 100) reasons.push(`${quantity} must lie between 0 and ${top} (got ${y})`);
    if (x > 0 && x <= previous)
      reasons.push(`wavelength ${x} nm does not increase (previous row ${previous} nm)`);
    if (x > previous) previous = x;
    if (reasons.length > 0) {
      problems.push({ row: line, reason: reasons.join('; ') });
      continue;
    }
    spectrum.wavelengthsNm.push(x);
    // 15 significant digits drop the binary rounding of ×100 (0.9568 × 100 = 95.67999…).
    spectrum.valuesPercent.push(scale === 1 ? y : Number((y * 100).toPrecision(15)));
  }
  const lastWavelength = spectrum.wavelengthsNm.at(-1);
  if (problems.length === 0 && lastWavelength !== undefined && lastWavelength < 100) {
    problems.push({ row: 0, reason: 'the wavelengths look like µm (all below 100); the file must give nm' });
  }
  problems.sort((a, b) => a.row - b.row);
  return problems.length > 0 ? { ok: false, problems } : { ok: true, spectrum };
}
