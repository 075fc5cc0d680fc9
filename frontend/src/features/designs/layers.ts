/*
 * The Layer grid's rows and the rules the API applies to them (designLayerSchema and DESIGN_LIMITS
 * in shared/src/schemas/designs.ts: a material of the library, the thickness limits, the most
 * layers, the notes' length), checked here so a bad cell is shown where it is and never sent.
 */
import {
  elementAt,
  DESIGN_LIMITS,
  designLayerSchema,
  layerThicknessNm,
  materialNmToQwot,
  materialQwotToNm,
  type DesignLayer,
  type MaterialModel,
} from '@quietglass/shared';
import { parseNumberInput } from '../../lib/format';
import { typedNumber } from '../../lib/validation';

/** A material as the design workspace needs it (a MaterialView of the library fits). */
export interface LibraryMaterial {
  id: number;
  name: string;
  model: MaterialModel;
  rangeNm?: { from: number; to: number };
  /** Set when retired: pickers no longer offer it, rows that use it keep it. */
  retiredAt?: string | null;
}

/** One row of the Layer grid, incident side first. Thickness is kept as typed until it is valid. */
export interface LayerRow {
  id: string;
  materialId: number | null;
  /** Physical thickness in nm as text: what was typed, or the full-precision value from a QWOT. */
  thicknessNm: string;
  /** A QWOT entry that is not a valid number, kept so the cell can show it with its error. */
  qwotInput: string | null;
  locked: boolean;
  notes: string;
}

export const MAX_LAYERS = DESIGN_LIMITS.maxLayers;
/** What is wrong with a layer's notes, in the API's words; null when they can be saved. */
function notesProblem(notes: string): string | null {
  const parsed = designLayerSchema.shape.notes.safeParse(notes);
  return parsed.success ? null : `Notes: ${parsed.error.issues[0]?.message ?? 'not valid'}`;
}

let lastRowId = 0;
/** A new row id, unique within the page. */
export function newRowId(): string {
  lastRowId += 1;
  return `layer-${lastRowId}`;
}

export function emptyRow(materialId: number | null): LayerRow {
  return { id: newRowId(), materialId, thicknessNm: '', qwotInput: null, locked: false, notes: '' };
}

export function rowsFromLayers(layers: readonly DesignLayer[]): LayerRow[] {
  return layers.map((layer) => ({
    id: newRowId(),
    materialId: layer.materialId,
    thicknessNm: String(layer.thicknessNm),
    qwotInput: null,
    locked: layer.locked,
    notes: layer.notes,
  }));
}

const typedThickness = typedNumber.pipe(layerThicknessNm);

/** What is wrong with a thickness entry, in the API's words, for the cell; null when it is valid. */
export function thicknessProblem(text: string): string | null {
  const parsed = typedThickness.safeParse(text);
  return parsed.success ? null : (parsed.error.issues[0]?.message ?? 'Not a thickness');
}

export function parsedThickness(row: LayerRow): number | null {
  return thicknessProblem(row.thicknessNm) === null ? parseNumberInput(row.thicknessNm) : null;
}

export function materialProblem(
  row: LayerRow,
  materialsById: ReadonlyMap<number, LibraryMaterial>,
): string | null {
  if (row.materialId === null) return 'choose a material';
  if (!materialsById.has(row.materialId)) return `material ${row.materialId} is not in the library`;
  return null;
}

export function qwotProblem(text: string): string | null {
  const value = parseNumberInput(text);
  if (value === null) return `"${text.trim()}" is not a number`;
  if (!(value > 0)) return 'must be greater than 0';
  return null;
}

export interface LayerProblem {
  rowId: string;
  /** 0-based position in the grid. */
  index: number;
  field: 'materialId' | 'thicknessNm' | 'qwot' | 'notes';
  message: string;
}

/** Every problem of the grid, in row order; an empty list means the layers can be saved. */
export function layerProblems(
  rows: readonly LayerRow[],
  materialsById: ReadonlyMap<number, LibraryMaterial>,
): LayerProblem[] {
  const problems: LayerProblem[] = [];
  rows.forEach((row, index) => {
    const material = materialProblem(row, materialsById);
    if (material) problems.push({ rowId: row.id, index, field: 'materialId', message: material });
    if (row.qwotInput !== null) {
      const qwot =
        qwotProblem(row.qwotInput) ?? 'cannot be converted without a valid material and reference wavelength';
      problems.push({ rowId: row.id, index, field: 'qwot', message: `QWOT ${qwot}` });
    } else {
      const thickness = thicknessProblem(row.thicknessNm);
      if (thickness) problems.push({ rowId: row.id, index, field: 'thicknessNm', message: thickness });
    }
    const notes = notesProblem(row.notes);
    if (notes) problems.push({ rowId: row.id, index, field: 'notes', message: notes });
  });
  return problems;
}

/** "Layer 2: Thickness must be greater than 0 nm" — how a problem reads outside the grid. */
export function describeProblem(problem: LayerProblem): string {
  return `Layer ${problem.index + 1}: ${problem.message}`;
}

/** The rows as the API takes them; only call when `layerProblems` is empty. */
export function layersFromRows(rows: readonly LayerRow[]): DesignLayer[] {
  return rows.map((row) => {
    const thicknessNm = parsedThickness(row);
    if (row.materialId === null || thicknessNm === null) throw new Error('the layers are not valid');
    return { materialId: row.materialId, thicknessNm, locked: row.locked, notes: row.notes };
  });
}

/** QWOT at the reference wavelength, 4·n(λref)·d/λref (Macleod ch. 2), or null when it cannot be known. */
export function qwotOfRow(
  row: LayerRow,
  material: LibraryMaterial | undefined,
  referenceNm: number | null,
): number | null {
  const thickness = parsedThickness(row);
  if (thickness === null || !material || referenceNm === null) return null;
  try {
    return materialNmToQwot(material.model, thickness, referenceNm);
  } catch {
    return null;
  }
}

/** Physical thickness (nm) of `qwot` quarter waves at the reference wavelength, or null. */
export function thicknessForQwot(
  material: LibraryMaterial | undefined,
  qwot: number,
  referenceNm: number | null,
): number | null {
  if (!material || referenceNm === null) return null;
  try {
    return materialQwotToNm(material.model, qwot, referenceNm);
  } catch {
    return null;
  }
}

export function formatThickness(value: number): string {
  return value.toFixed(2);
}

export function formatQwot(value: number): string {
  return value.toFixed(4);
}

/** Moves a row up (−1) or down (+1); the rows are unchanged at either end. */
export function moveRow(rows: readonly LayerRow[], id: string, delta: -1 | 1): LayerRow[] {
  const from = rows.findIndex((r) => r.id === id);
  const to = from + delta;
  if (from < 0 || to < 0 || to >= rows.length) return [...rows];
  const next = [...rows];
  [next[from], next[to]] = [elementAt(rows, to, 'the rows'), elementAt(rows, from, 'the rows')];
  return next;
}

export function insertRow(rows: readonly LayerRow[], index: number, row: LayerRow): LayerRow[] {
  return [...rows.slice(0, index), row, ...rows.slice(index)];
}

export type PasteResult = { ok: true; rows: LayerRow[] } | { ok: false; problems: string[] };

/** How pasted thicknesses are read: physical nm, quarter waves or full waves at the reference wavelength. */
export type ThicknessUnit = 'nm' | 'qwot' | 'fwot';

export const THICKNESS_UNIT_LABELS: Record<ThicknessUnit, string> = {
  nm: 'nm',
  qwot: 'QWOT',
  fwot: 'FWOT',
};

export interface PasteOptions {
  /** The unit of a thickness column whose header does not name one (default nm). */
  unit?: ThicknessUnit;
  /** Reference wavelength for QWOT and FWOT, nm. */
  referenceNm?: number | null;
}

/** The cell separator of pasted text: tabs (spreadsheets), else semicolons, else commas. */
export function pastedSeparator(text: string): '\t' | ';' | ',' {
  if (text.includes('\t')) return '\t';
  if (text.includes(';')) return ';';
  return ',';
}

/** Splits one line at `separator`, keeping separators inside double quotes ("a, b"). */
function splitCells(line: string, separator: string): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') {
      if (quoted && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else quoted = !quoted;
    } else if (c === separator && !quoted) {
      cells.push(cell);
      cell = '';
    } else cell += c;
  }
  cells.push(cell);
  return cells.map((x) => x.trim());
}

/** A number typed with a decimal comma ("96,8") as the engine reads it ("96.8"). */
export function withDecimalPoint(text: string): string {
  const trimmed = text.trim();
  return /^[+-]?\d*,\d+$/.test(trimmed) ? trimmed.replace(',', '.') : trimmed;
}

interface PasteColumns {
  material: number;
  thickness: number;
  notes: number[];
  unit: ThicknessUnit | null;
}

/** The columns named by a header line, or null when the line is not a header. */
function headerColumns(cells: readonly string[]): PasteColumns | null {
  const material = cells.findIndex(
    (c) => /^(material|layer material|mat\.?)$/i.test(c) || /^material\b/i.test(c),
  );
  const thickness = cells.findIndex((c) => /thickness|qwot|fwot|\bnm\b|optical/i.test(c));
  if (material < 0 || thickness < 0) return null;
  const head = elementAt(cells, thickness, 'the header cells');
  const unit: ThicknessUnit | null = /fwot|full.?wave/i.test(head)
    ? 'fwot'
    : /qwot|quarter.?wave/i.test(head)
      ? 'qwot'
      : /\bnm\b|\(nm\)/i.test(head)
        ? 'nm'
        : null;
  const notes = cells.flatMap((c, i) =>
    i !== material && i !== thickness && /note|comment/i.test(c) ? [i] : [],
  );
  return { material, thickness, notes, unit };
}

/**
 * Reads rows copied from a spreadsheet or a CSV file: one layer per line, cells separated by tabs,
 * semicolons or commas — material name (any case), thickness and optionally notes. A first line
 * naming the columns ("Material; QWOT; Notes") sets their order and the thickness unit (nm, QWOT
 * or FWOT, else `options.unit`); a decimal comma is read as a decimal point. QWOT and FWOT become
 * nm at the reference wavelength (QWOT = 4·n·d/λ, FWOT = n·d/λ). Any bad line rejects the whole
 * paste and every problem is listed with its line.
 */
export function parsePastedRows(
  text: string,
  materials: readonly LibraryMaterial[],
  options: PasteOptions = {},
): PasteResult {
  const byName = new Map(materials.map((m) => [m.name.trim().toLowerCase(), m]));
  const separator = pastedSeparator(text);
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  const problems: string[] = [];
  const rows: LayerRow[] = [];
  let columns: PasteColumns = { material: 0, thickness: 1, notes: [], unit: null };
  let notesFromRest = true;
  const firstLine = lines.findIndex((l) => l.trim() !== '');
  lines.forEach((line, i) => {
    if (line.trim() === '') return;
    const lineNo = i + 1;
    const cells = splitCells(line, separator);
    if (i === firstLine && parseNumberInput(withDecimalPoint(cells[1] ?? '')) === null) {
      const header = headerColumns(cells);
      if (header) {
        columns = header;
        notesFromRest = false;
        return;
      }
    }
    if (cells.length < 2) {
      problems.push(
        `Row ${lineNo}: expected a material name and a thickness separated by a tab, comma or semicolon`,
      );
      return;
    }
    const name = (cells[columns.material] ?? '').trim();
    const material = byName.get(name.toLowerCase());
    const rowProblems: string[] = [];
    if (name === '') rowProblems.push('the material name is empty');
    else if (!material) rowProblems.push(`unknown material "${name}"`);
    const thicknessText = withDecimalPoint(cells[columns.thickness] ?? '');
    const unit = columns.unit ?? options.unit ?? 'nm';
    let thicknessNm = thicknessText;
    if (unit === 'nm') {
      const problem = thicknessProblem(thicknessText);
      if (problem) rowProblems.push(problem);
    } else {
      const label = THICKNESS_UNIT_LABELS[unit];
      const problem = qwotProblem(thicknessText);
      if (problem) rowProblems.push(`${label} ${problem}`);
      else if (material) {
        const value = parseNumberInput(thicknessText) ?? 0;
        const nm = thicknessForQwot(
          material,
          unit === 'fwot' ? 4 * value : value,
          options.referenceNm ?? null,
        );
        if (nm === null) rowProblems.push(`${label} needs a valid reference wavelength`);
        else {
          const problem = thicknessProblem(String(nm));
          if (problem) rowProblems.push(problem);
          thicknessNm = String(nm);
        }
      }
    }
    const noteCells = notesFromRest
      ? cells.filter((_c, k) => k !== columns.material && k !== columns.thickness)
      : columns.notes.map((k) => cells[k] ?? '');
    const notes = noteCells.join(' ').trim();
    const notesBad = notesProblem(notes);
    if (notesBad) rowProblems.push(notesBad);
    if (rowProblems.length > 0 || !material) {
      problems.push(`Row ${lineNo}: ${rowProblems.join('; ')}`);
      return;
    }
    rows.push({
      id: newRowId(),
      materialId: material.id,
      thicknessNm,
      qwotInput: null,
      locked: false,
      notes,
    });
  });
  if (problems.length > 0) return { ok: false, problems };
  if (rows.length === 0) return { ok: false, problems: ['Nothing to paste: the text has no rows'] };
  if (rows.length > MAX_LAYERS)
    return { ok: false, problems: [`At most ${MAX_LAYERS} layers can be pasted`] };
  return { ok: true, rows };
}

/** Text of a block of rows is a paste of layers rather than one cell's value: several lines or cells. */
export function looksLikeRows(text: string): boolean {
  const trimmed = text.trim();
  return /\n/.test(trimmed) || /\t/.test(trimmed) || /^[^;,]*[A-Za-z][^;,]*[;,]\s*[\d.,]+/.test(trimmed);
}

/**
 * The period (H L)^n: `count` repeats of the two rows, as new rows (their ids fresh), in order.
 */
export function periodRows(high: LayerRow, low: LayerRow, count: number): LayerRow[] {
  const rows: LayerRow[] = [];
  for (let i = 0; i < count; i++) rows.push({ ...high, id: newRowId() }, { ...low, id: newRowId() });
  return rows;
}

/** The rows with the block from `from` to `to` (inclusive, 0-based) in reverse order. */
export function reverseBlock(rows: readonly LayerRow[], from: number, to: number): LayerRow[] {
  const a = Math.max(0, Math.min(from, to));
  const b = Math.min(rows.length - 1, Math.max(from, to));
  return [...rows.slice(0, a), ...rows.slice(a, b + 1).reverse(), ...rows.slice(b + 1)];
}
