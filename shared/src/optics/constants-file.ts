/*
 * Reader for published optical-constants files: a small YAML document with the literature
 * reference (`REFERENCES`), sample notes (`COMMENTS`), optional `CONDITIONS` and one or two `DATA`
 * entries. Wavelengths in these files are in µm; the models returned use nm like the rest of the
 * engine.
 *
 * DATA entry types read here:
 * - `tabulated nk` (rows λ n k), `tabulated n` (rows λ n, k = 0), `tabulated k` (rows λ k, only as
 *   the second entry, giving k for the first entry's n);
 * - `formula 1` Sellmeier: n² − 1 = C1 + Σᵢ C(2i) λ² / (λ² − C(2i+1)²);
 * - `formula 2` Sellmeier with Cᵢ in µm²: n² − 1 = C1 + Σᵢ C(2i) λ² / (λ² − C(2i+1));
 * - `formula 5` power series n = C1 + Σᵢ C(2i) λ^C(2i+1), read when its exponents are −2 and −4
 *   (the Cauchy form).
 * A formula alone becomes the engine's Sellmeier or Cauchy model with its `wavelength_range` as
 * `validNm`; a formula n with a `tabulated k` becomes a table at the k rows.
 */
import { elementAt } from '../checked.js';
import type { MaterialModel, TabulatedIndex } from './dispersion.js';
import { validateMaterialModel } from './dispersion.js';
import { OpticsInputError } from './errors.js';

/** What a constants file holds, ready to become a material of the library. */
export interface ConstantsFile {
  /** The literature reference as plain text (markup removed), one reference per line. */
  reference: string;
  /** The first DOI named in the reference, or null. */
  doi: string | null;
  /** The file's sample notes (`COMMENTS`) as plain text, with its `CONDITIONS` appended. */
  notes: string;
  /** How the data were given, e.g. "Sellmeier formula (formula 1), 0.21–6.7 µm". */
  form: string;
  /** A validated engine model: a table, or a Sellmeier/Cauchy model with `validNm`. */
  model: MaterialModel;
  /** Wavelengths (nm) the data cover. */
  rangeNm: { from: number; to: number };
}

/** Largest constants file accepted (characters). */
export const MAX_CONSTANTS_FILE_CHARS = 2_000_000;

interface DataEntry {
  type: string;
  fields: Record<string, string>;
}

/** A table row: wavelength (µm) and one or two values (a missing second value reads as 0). */
type Row = [wavelengthUm: number, first: number, second: number];

/**
 * Reads a constants file. Throws {@link OpticsInputError} naming the part that is wrong (a missing
 * `REFERENCES`, an unknown DATA type, a bad row with its number); nothing is returned for a file
 * that is not valid throughout.
 */
export function parseConstantsFile(text: string): ConstantsFile {
  if (typeof text !== 'string' || text.trim() === '') {
    throw new OpticsInputError('file', 'the file is empty');
  }
  if (text.length > MAX_CONSTANTS_FILE_CHARS) {
    throw new OpticsInputError('file', `the file is larger than ${MAX_CONSTANTS_FILE_CHARS} characters`);
  }
  const sections = topLevel(text.replace(/\r\n?/g, '\n'));
  const refs = sections.get('REFERENCES');
  if (!refs || blockText(refs).trim() === '') {
    throw new OpticsInputError('REFERENCES', 'the file names no literature reference');
  }
  const rawRefs = blockText(refs);
  const reference = plainText(rawRefs);
  const doi = /(?:doi\.org\/|doi:\s*)(10\.\d{4,9}\/[^\s"<>]+)/i.exec(rawRefs)?.[1] ?? null;
  const comments = sections.get('COMMENTS');
  const conditions = sections.get('CONDITIONS');
  const notes = [comments ? plainText(blockText(comments)) : '', conditions ? conditionsText(conditions) : '']
    .filter((s) => s !== '')
    .join('\n');

  const dataLines = sections.get('DATA');
  if (!dataLines) throw new OpticsInputError('DATA', 'the file has no DATA section');
  const entries = dataEntries(dataLines);
  const [first, second] = entries;
  if (!first || entries.length > 2) {
    throw new OpticsInputError('DATA', `expected one or two entries (got ${entries.length})`);
  }
  const { model, form } = second ? withTabulatedK(first, second) : single(first);
  const checked = validateMaterialModel(model, 'DATA');
  const range =
    checked.model === 'table'
      ? {
          from: elementAt(checked.wavelengths, 0, 'the table wavelengths'),
          to: elementAt(checked.wavelengths, checked.wavelengths.length - 1, 'the table wavelengths'),
        }
      : checked.model === 'constant'
        ? null
        : (checked.validNm ?? null);
  if (!range) throw new OpticsInputError('DATA', 'the data state no wavelength range');
  return { reference, doi, notes, form, model: checked, rangeNm: { ...range } };
}

/** µm → nm, rounded to 1e-6 nm so 0.252 µm reads as 252 nm, not 252.00000000000003. */
function nmOf(um: number): number {
  return Number((um * 1000).toFixed(6));
}

function single(entry: DataEntry): { model: MaterialModel; form: string } {
  if (entry.type === 'tabulated nk' || entry.type === 'tabulated n') {
    const cols = entry.type === 'tabulated nk' ? 3 : 2;
    const rows = tableRows(entry, cols);
    return {
      model: {
        model: 'table',
        wavelengths: rows.map((r) => nmOf(r[0])),
        n: rows.map((r) => r[1]),
        k: rows.map((r) => (cols === 3 ? r[2] : 0)),
        interpolation: 'linear',
      },
      form: `${entry.type === 'tabulated nk' ? 'tabulated n,k' : 'tabulated n (k = 0)'}, ${rows.length} rows`,
    };
  }
  const formula = readFormula(entry);
  const validNm = { from: nmOf(formula.rangeUm[0]), to: nmOf(formula.rangeUm[1]) };
  const span = `${formula.rangeUm[0]}–${formula.rangeUm[1]} µm`;
  const [c0, terms] = [formula.constant, formula.terms];
  if (formula.kind === 5) {
    let B = 0;
    let C = 0;
    for (const { coefficient, exponent } of terms) {
      if (exponent === -2) B += coefficient;
      else if (exponent === -4) C += coefficient;
      else if (coefficient !== 0) {
        throw new OpticsInputError(
          'DATA[0].coefficients',
          `formula 5 is read in its Cauchy form (powers −2 and −4 of λ); this file has λ^${exponent}`,
        );
      }
    }
    return {
      model: { model: 'cauchy', A: c0, B, C, k: 0, validNm },
      form: `Cauchy formula (formula 5), ${span}`,
    };
  }
  if (c0 !== 0) {
    throw new OpticsInputError(
      'DATA[0].coefficients',
      `a Sellmeier formula with a constant term (C1 = ${c0}) is read only together with a tabulated k`,
    );
  }
  const B: number[] = [];
  const Cs: number[] = [];
  for (const { coefficient, exponent: ci } of terms) {
    B.push(coefficient);
    Cs.push(formula.kind === 1 ? ci * ci : ci);
  }
  if (B.length > 3) {
    throw new OpticsInputError(
      'DATA[0].coefficients',
      `at most 3 Sellmeier terms are read (got ${B.length})`,
    );
  }
  return {
    model: { model: 'sellmeier', B, C: Cs, k: 0, validNm },
    form: `Sellmeier formula (formula ${formula.kind}${formula.kind === 1 ? ', resonance wavelengths in µm' : ', Cᵢ in µm²'}), ${span}`,
  };
}

/** A formula or tabulated n with a tabulated k: a table at the rows where both are given. */
function withTabulatedK(first: DataEntry, second: DataEntry): { model: MaterialModel; form: string } {
  if (second.type !== 'tabulated k') {
    throw new OpticsInputError('DATA[1].type', `a second entry must be "tabulated k" (got "${second.type}")`);
  }
  const kRows = tableRows(second, 2, 'DATA[1]');
  const kAt = (um: number) => interpolate(kRows, um);
  const kFrom = elementAt(kRows, 0, 'the k rows')[0];
  const kTo = elementAt(kRows, kRows.length - 1, 'the k rows')[0];
  let wavelengthsUm: number[];
  let nAt: (um: number) => number;
  let form: string;
  if (first.type === 'tabulated n') {
    const nRows = tableRows(first, 2);
    wavelengthsUm = nRows.map((r) => r[0]).filter((um) => um >= kFrom && um <= kTo);
    nAt = (um) => interpolate(nRows, um);
    form = `tabulated n with tabulated k, ${wavelengthsUm.length} rows`;
  } else {
    const formula = readFormula(first);
    const [lo, hi] = formula.rangeUm;
    wavelengthsUm = kRows.map((r) => r[0]).filter((um) => um >= lo && um <= hi);
    nAt = (um) => formulaN(formula, um);
    form = `formula ${formula.kind} n (${lo}–${hi} µm) at the ${wavelengthsUm.length} rows of the tabulated k`;
  }
  if (wavelengthsUm.length < 2) {
    throw new OpticsInputError('DATA', 'n and k overlap at fewer than 2 wavelengths');
  }
  const table: TabulatedIndex = {
    model: 'table',
    wavelengths: wavelengthsUm.map(nmOf),
    n: wavelengthsUm.map(nAt),
    k: wavelengthsUm.map(kAt),
    interpolation: 'linear',
  };
  return { model: table, form };
}

interface Formula {
  kind: 1 | 2 | 5;
  rangeUm: [number, number];
  /** C1. */
  constant: number;
  /** The pairs C(2i), C(2i+1) after C1; a missing last C(2i+1) reads as 0. */
  terms: { coefficient: number; exponent: number }[];
}

function readFormula(entry: DataEntry): Formula {
  const match = /^formula (\d+)$/.exec(entry.type);
  const kind = match ? Number(match[1]) : NaN;
  if (kind !== 1 && kind !== 2 && kind !== 5) {
    throw new OpticsInputError(
      'DATA[0].type',
      `"${entry.type}" is not read; expected tabulated nk, tabulated n, formula 1, formula 2 or formula 5`,
    );
  }
  const range = numbers(entry.fields.wavelength_range ?? '', 'DATA[0].wavelength_range');
  const [lo, hi] = range;
  if (range.length !== 2 || lo === undefined || hi === undefined || !(lo > 0) || !(hi > lo)) {
    throw new OpticsInputError('DATA[0].wavelength_range', 'must be two wavelengths in µm, low then high');
  }
  const [constant, ...rest] = numbers(entry.fields.coefficients ?? '', 'DATA[0].coefficients');
  if (constant === undefined || rest.length < 2) {
    throw new OpticsInputError(
      'DATA[0].coefficients',
      `too few coefficients (${rest.length + (constant === undefined ? 0 : 1)})`,
    );
  }
  const terms: Formula['terms'] = [];
  for (let i = 0; i < rest.length; i += 2)
    terms.push({ coefficient: elementAt(rest, i, 'the coefficients'), exponent: rest[i + 1] ?? 0 });
  return { kind, rangeUm: [lo, hi], constant, terms };
}

/** n of a formula at λ (µm), straight from the file's definition. */
function formulaN(f: Formula, um: number): number {
  if (f.kind === 5) {
    let n = f.constant;
    for (const { coefficient, exponent } of f.terms) n += coefficient * um ** exponent;
    return n;
  }
  const l2 = um * um;
  let n2 = 1 + f.constant;
  for (const { coefficient, exponent: ci } of f.terms) {
    n2 += (coefficient * l2) / (l2 - (f.kind === 1 ? ci * ci : ci));
  }
  return Math.sqrt(n2);
}

function interpolate(rows: Row[], um: number): number {
  let j = 0;
  while (j < rows.length - 2 && elementAt(rows, j + 1, 'the rows')[0] < um) j++;
  const [x0, y0] = elementAt(rows, j, 'the rows');
  const [x1, y1] = elementAt(rows, j + 1, 'the rows');
  return y0 + ((um - x0) / (x1 - x0)) * (y1 - y0);
}

function numbers(text: string, field: string): number[] {
  const parts = text
    .trim()
    .split(/\s+/)
    .filter((p) => p !== '');
  return parts.map((p) => {
    const x = Number(p);
    if (!Number.isFinite(x)) throw new OpticsInputError(field, `"${p}" is not a number`);
    return x;
  });
}

function tableRows(entry: DataEntry, cols: 2 | 3, field = 'DATA[0]'): Row[] {
  const data = entry.fields.data;
  if (data === undefined) throw new OpticsInputError(`${field}.data`, 'the entry has no data rows');
  const rows: Row[] = [];
  data.split('\n').forEach((line, i) => {
    if (line.trim() === '') return;
    const cells = line.trim().split(/\s+/);
    const at = `${field}.data row ${i + 1}`;
    if (cells.length !== cols) {
      throw new OpticsInputError(at, `has ${cells.length} values, "${entry.type}" rows have ${cols}`);
    }
    const values = cells.map((c) => Number(c));
    if (values.some((x) => !Number.isFinite(x)))
      throw new OpticsInputError(at, `not a number in "${line.trim()}"`);
    const row: Row = [elementAt(values, 0, at), elementAt(values, 1, at), values[2] ?? 0];
    const previous = rows[rows.length - 1];
    if (previous && !(row[0] > previous[0])) {
      throw new OpticsInputError(at, `wavelength ${row[0]} µm does not increase`);
    }
    rows.push(row);
  });
  if (rows.length < 2) throw new OpticsInputError(`${field}.data`, 'needs at least 2 rows');
  return rows;
}

/** Top-level keys (at column 0) and the indented lines under each; `#` comment lines skipped. */
function topLevel(text: string): Map<string, { head: string; lines: string[] }> {
  const out = new Map<string, { head: string; lines: string[] }>();
  let current: { head: string; lines: string[] } | null = null;
  for (const line of text.split('\n')) {
    if (/^\s*#/.test(line)) continue;
    const key = /^([A-Za-z_][\w]*):\s*(.*)$/.exec(line);
    if (key) {
      const [, name = '', head = ''] = key;
      current = { head: head.trim(), lines: [] };
      out.set(name, current);
    } else if (current && (line.trim() === '' || /^\s/.test(line))) {
      current.lines.push(line);
    } else if (line.trim() !== '') {
      throw new OpticsInputError('file', `unexpected line "${line.trim().slice(0, 60)}"`);
    }
  }
  return out;
}

/** A block (`KEY: |` and indented lines, or a one-line value) as text, dedented. */
function blockText(section: { head: string; lines: string[] }): string {
  if (section.head !== '|' && section.head !== '') return section.head;
  return dedent(section.lines);
}

function dedent(lines: string[]): string {
  const filled = lines.filter((l) => l.trim() !== '');
  const indent = Math.min(...filled.map(leadingSpaces));
  return lines
    .map((l) => l.slice(Math.min(indent, l.length)))
    .join('\n')
    .trim();
}

function leadingSpaces(line: string): number {
  return line.length - line.trimStart().length;
}

function conditionsText(section: { head: string; lines: string[] }): string {
  return dedent(section.lines)
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '')
    .join(', ')
    .replace(/^/, 'Conditions: ');
}

function dataEntries(section: { head: string; lines: string[] }): DataEntry[] {
  const items: string[][] = [];
  for (const raw of section.lines) {
    const item = /^(\s*)- (.*)$/.exec(raw);
    const last = items[items.length - 1];
    if (item) items.push([`${item[1] ?? ''}  ${item[2] ?? ''}`]);
    else if (last) last.push(raw);
    else if (raw.trim() !== '') throw new OpticsInputError('DATA', 'entries must start with "- "');
  }
  return items.map((lines, i) => {
    const keyIndent = leadingSpaces(lines[0] ?? '');
    const fields: Record<string, { head: string; lines: string[] }> = {};
    let current: { head: string; lines: string[] } | null = null;
    for (const line of lines) {
      const indent = leadingSpaces(line);
      const key = /^\s*([A-Za-z_]\w*):\s*(.*)$/.exec(line);
      if (key && indent === keyIndent) {
        const [, name = '', head = ''] = key;
        current = { head: head.trim(), lines: [] };
        fields[name] = current;
      } else if (current) {
        current.lines.push(line);
      }
    }
    const type = fields.type ? blockText(fields.type) : '';
    if (type === '') throw new OpticsInputError(`DATA[${i}].type`, 'the entry names no type');
    const flat: Record<string, string> = {};
    for (const [k, v] of Object.entries(fields)) flat[k] = blockText(v);
    return { type, fields: flat };
  });
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: ' ' };

/** Markup to plain text: `<br>` ends a line, other tags go, whitespace within a line collapses. */
function plainText(markup: string): string {
  return markup
    .replace(/<br\s*\/?>/gi, '\u0000')
    .replace(/<[^>]*>/g, '')
    .replace(/&(#\d+|\w+);/g, (m, e: string) =>
      e.startsWith('#') ? String.fromCharCode(Number(e.slice(1))) : (ENTITIES[e] ?? m),
    )
    .split('\u0000')
    .map((part) => part.replace(/\s+/g, ' ').trim())
    .filter((part) => part !== '')
    .join('\n');
}
