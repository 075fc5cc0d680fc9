/*
 * The Layer grid's rows and the rules the API applies to them (DesignLayerDto: materialId a
 * material of the library, 0 < thicknessNm ≤ 100000 nm, at most 400 layers, notes ≤ 500
 * characters), checked here so a bad cell is shown where it is and never sent.
 */
import { materialNmToQwot, materialQwotToNm, type DesignLayer, type MaterialModel } from '@quietglass/shared';
import { parseNumberInput } from '../../lib/format';

/** A material as the design workspace needs it (a MaterialView of the library fits). */
export interface LibraryMaterial {
  id: number;
  name: string;
  model: MaterialModel;
  rangeNm?: { from: number; to: number };
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

export const MAX_THICKNESS_NM = 100_000;
export const MAX_LAYERS = 400;
export const MAX_LAYER_NOTES = 500;

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

/** What is wrong with a thickness entry, in a few words for the cell; null when it is valid. */
export function thicknessProblem(text: string): string | null {
  if (text.trim() === '') return 'enter a thickness';
  const value = parseNumberInput(text);
  if (value === null) return `"${text.trim()}" is not a number`;
  if (!(value > 0)) return 'must be greater than 0 nm';
  if (value > MAX_THICKNESS_NM) return `must be at most ${MAX_THICKNESS_NM} nm`;
  return null;
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
      if (thickness)
        problems.push({ rowId: row.id, index, field: 'thicknessNm', message: `thickness ${thickness}` });
    }
    if (row.notes.length > MAX_LAYER_NOTES)
      problems.push({
        rowId: row.id,
        index,
        field: 'notes',
        message: `notes must be at most ${MAX_LAYER_NOTES} characters`,
      });
  });
  return problems;
}

/** "Layer 2: thickness must be greater than 0 nm" — how a problem reads outside the grid. */
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
  [next[from], next[to]] = [next[to], next[from]];
  return next;
}

export function insertRow(rows: readonly LayerRow[], index: number, row: LayerRow): LayerRow[] {
  return [...rows.slice(0, index), row, ...rows.slice(index)];
}

export type PasteResult = { ok: true; rows: LayerRow[] } | { ok: false; problems: string[] };

/**
 * Reads rows copied from a spreadsheet: one layer per line, cells separated by tabs — material
 * name, thickness in nm and optionally notes. A first line naming the columns ("Material…") is
 * skipped. Any bad line rejects the whole paste and every problem is listed with its line.
 */
export function parsePastedRows(text: string, materials: readonly LibraryMaterial[]): PasteResult {
  const byName = new Map(materials.map((m) => [m.name.trim().toLowerCase(), m]));
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  const problems: string[] = [];
  const rows: LayerRow[] = [];
  lines.forEach((line, i) => {
    if (line.trim() === '') return;
    const lineNo = i + 1;
    const cells = line.split('\t');
    if (i === 0 && /^\s*material/i.test(cells[0]) && parseNumberInput(cells[1] ?? '') === null) return;
    if (cells.length < 2) {
      problems.push(`Row ${lineNo}: expected a material name and a thickness separated by a tab`);
      return;
    }
    const name = cells[0].trim();
    const material = byName.get(name.toLowerCase());
    const rowProblems: string[] = [];
    if (name === '') rowProblems.push('the material name is empty');
    else if (!material) rowProblems.push(`unknown material "${name}"`);
    const thickness = thicknessProblem(cells[1]);
    if (thickness) rowProblems.push(`thickness ${thickness}`);
    const notes = cells.slice(2).join(' ').trim();
    if (notes.length > MAX_LAYER_NOTES)
      rowProblems.push(`notes must be at most ${MAX_LAYER_NOTES} characters`);
    if (rowProblems.length > 0 || !material) {
      problems.push(`Row ${lineNo}: ${rowProblems.join('; ')}`);
      return;
    }
    rows.push({
      id: newRowId(),
      materialId: material.id,
      thicknessNm: cells[1].trim(),
      qwotInput: null,
      locked: false,
      notes,
    });
  });
  if (problems.length > 0) return { ok: false, problems };
  if (rows.length === 0) return { ok: false, problems: ['Nothing to paste: the text has no rows'] };
  return { ok: true, rows };
}
