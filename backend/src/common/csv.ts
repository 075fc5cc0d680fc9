import Papa from 'papaparse';

/** A problem with an uploaded file: 1-based line number (0 for the file as a whole) and reason. */
export interface CsvProblem {
  row: number;
  reason: string;
}

/** A plain decimal number (no NaN, Infinity, hex or thousands separators), or null. */
export function numericCell(value: string): number | null {
  const t = value.trim();
  return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : null;
}

export type CsvRows =
  { ok: true; rows: string[][]; lines: number[]; delimiter: string } | { ok: false; problems: CsvProblem[] };

/**
 * Splits CSV text into rows (empty lines skipped, BOM removed), with each row's line number in the
 * file. Rejects empty files, files over `maxBytes` and unbalanced quotes.
 */
export function readCsvRows(
  text: string,
  maxBytes: number,
  delimiters: string[] = [',', ';', '\t'],
): CsvRows {
  if (new TextEncoder().encode(text).length > maxBytes) {
    const size = maxBytes >= 1_000_000 ? `${maxBytes / 1_000_000} MB` : `${maxBytes / 1000} kB`;
    return { ok: false, problems: [{ row: 0, reason: `the file is larger than ${size}` }] };
  }
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return { ok: false, problems: [{ row: 0, reason: 'the file is empty' }] };
  const parsed = Papa.parse<string[]>(body, { skipEmptyLines: 'greedy', delimitersToGuess: delimiters });
  const quote = parsed.errors.find((e) => e.type === 'Quotes');
  if (quote)
    return {
      ok: false,
      problems: [{ row: (quote.row ?? 0) + 1, reason: `unbalanced quotes: ${quote.message}` }],
    };
  const lines = body.split(/\r\n|\n|\r/).flatMap((line, i) => (line.trim() === '' ? [] : [i + 1]));
  return { ok: true, rows: parsed.data, lines, delimiter: parsed.meta.delimiter };
}

/** Problems as API details: `row N: reason`, or the reason alone for the whole file. */
export function problemDetails(problems: CsvProblem[]): string[] {
  return problems.map((p) => (p.row > 0 ? `row ${p.row}: ${p.reason}` : p.reason));
}

/**
 * Writes CSV for download. Text cells that a spreadsheet would run as a formula (a leading
 * `=`, `+`, `-`, `@`, tab or carriage return) get a `'` in front, as OWASP's CSV-injection guidance
 * advises; numbers are written as numbers, so a negative value stays a number.
 */
export function writeCsv(
  fields: readonly string[],
  rows: readonly (readonly (string | number | boolean | null | undefined)[])[],
): string {
  return (
    Papa.unparse(
      { fields: [...fields], data: rows.map((r) => [...r]) },
      { newline: '\n', escapeFormulae: true },
    ) + '\n'
  );
}
