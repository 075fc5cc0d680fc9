/*
 * How the panel reads the summaries of Fit to mask, Grow layers and Yield forecast (the engine's
 * FitResult, GrowResult and YieldForecast, stored as JSON) and turns them into table rows.
 */
import {
  elementAt,
  grownLayerMaterialId,
  type DesignLayer,
  type FitResult,
  type GrowResult,
  type GrowStep,
  type YieldForecast,
} from '@quietglass/shared';
import type { CalculationView } from './api/get-calculation';

/** Merit (percentage points) once the calculation has some: per iteration or per layer count. */
export interface MeritPoint {
  x: number;
  merit: number;
}

/** The streamed merit history of a running calculation (Fit: iteration, Grow: layer count). */
export function liveMerit(calculation: CalculationView): MeritPoint[] {
  const history = calculation.live?.history ?? [];
  const points: MeritPoint[] = [];
  history.forEach((h, i) => {
    const x = h.iteration ?? h.layerCount ?? i;
    if (Number.isFinite(h.merit)) points.push({ x, merit: h.merit });
  });
  return points;
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}

/** The Fit to mask result of a completed calculation, or null when the summary has another shape. */
export function fitResultOf(calculation: CalculationView): FitResult | null {
  const s = calculation.summary;
  return calculation.kind === 'fit' && isObject(s) && Array.isArray(s.thicknessesNm)
    ? (s as unknown as FitResult)
    : null;
}

export function growResultOf(calculation: CalculationView): GrowResult | null {
  const s = calculation.summary;
  return calculation.kind === 'grow' && isObject(s) && Array.isArray(s.steps)
    ? (s as unknown as GrowResult)
    : null;
}

export function yieldForecastOf(calculation: CalculationView): YieldForecast | null {
  const s = calculation.summary;
  return calculation.kind === 'yield' && isObject(s) && typeof s.yieldFraction === 'number'
    ? (s as unknown as YieldForecast)
    : null;
}

/** A layer as the before/after table shows it. */
export interface TableLayer {
  material: string;
  thicknessNm: number;
}

export interface ThicknessRow {
  /** Position after the change (1 = incident side); null for a layer that was removed. */
  layer: number | null;
  /** Position before the change; null for a new layer. */
  beforeLayer: number | null;
  before: TableLayer | null;
  after: TableLayer | null;
  /** after − before, nm, for a layer kept (same material on both sides). */
  changeNm: number | null;
  status: 'kept' | 'new' | 'removed';
}

/**
 * Pairs the version's layers with the result's by identity, not position: an alignment of the two
 * sequences (incident side first) that keeps as many layers as possible in their material and,
 * among those, changes the kept thicknesses least. A result layer left unpaired is new (Grow
 * layers inserted it), a version layer left unpaired was removed. For Fit to mask every layer is
 * kept in place.
 */
export function thicknessRows(before: readonly TableLayer[], after: readonly TableLayer[]): ThicknessRow[] {
  const n = before.length;
  const m = after.length;
  // best[i][j]: [kept count, −Σ|Δd|] of the best alignment of before[i..] with after[j..].
  const kept: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  const cost: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  const better = (k1: number, c1: number, k2: number, c2: number) =>
    k1 > k2 || (k1 === k2 && c1 < c2 - 1e-12);
  // Both tables are (n + 1) × (m + 1), so every i ≤ n, j ≤ m below is inside them.
  const row = (table: number[][], i: number) => elementAt(table, i, 'the alignment table');
  const cell = (table: number[][], i: number, j: number) => elementAt(row(table, i), j, 'an alignment row');
  for (let i = n; i >= 0; i--) {
    for (let j = m; j >= 0; j--) {
      if (i === n || j === m) continue;
      const b = elementAt(before, i, 'the layers before');
      const a = elementAt(after, j, 'the layers after');
      let k = cell(kept, i + 1, j);
      let c = cell(cost, i + 1, j);
      if (better(cell(kept, i, j + 1), cell(cost, i, j + 1), k, c)) {
        k = cell(kept, i, j + 1);
        c = cell(cost, i, j + 1);
      }
      if (b.material === a.material) {
        const km = cell(kept, i + 1, j + 1) + 1;
        const cm = cell(cost, i + 1, j + 1) + Math.abs(a.thicknessNm - b.thicknessNm);
        if (better(km, cm, k, c) || (km === k && Math.abs(cm - c) <= 1e-12)) {
          k = km;
          c = cm;
        }
      }
      row(kept, i)[j] = k;
      row(cost, i)[j] = c;
    }
  }
  const rows: ThicknessRow[] = [];
  let i = 0;
  let j = 0;
  while (i < n || j < m) {
    // Undefined exactly when i = n (all before-layers placed) or j = m (all after-layers placed).
    const b = before[i];
    const a = after[j];
    const match =
      b !== undefined &&
      a !== undefined &&
      b.material === a.material &&
      cell(kept, i, j) === cell(kept, i + 1, j + 1) + 1 &&
      Math.abs(cell(cost, i, j) - (cell(cost, i + 1, j + 1) + Math.abs(a.thicknessNm - b.thicknessNm))) <=
        1e-9;
    if (match) {
      rows.push({
        layer: j + 1,
        beforeLayer: i + 1,
        before: b,
        after: a,
        changeNm: a.thicknessNm - b.thicknessNm,
        status: 'kept',
      });
      i++;
      j++;
    } else if (
      a !== undefined &&
      (b === undefined ||
        (cell(kept, i, j) === cell(kept, i, j + 1) &&
          Math.abs(cell(cost, i, j) - cell(cost, i, j + 1)) <= 1e-9))
    ) {
      rows.push({
        layer: j + 1,
        beforeLayer: null,
        before: null,
        after: a,
        changeNm: null,
        status: 'new',
      });
      j++;
    } else {
      rows.push({
        layer: null,
        beforeLayer: i + 1,
        // i < n here: with i = n, j < m and the branch above took the new layer.
        before: elementAt(before, i, 'the layers before'),
        after: null,
        changeNm: null,
        status: 'removed',
      });
      i++;
    }
  }
  return rows;
}

/** The layers of a Fit to mask result: the version's materials with the fitted thicknesses. */
export function fittedLayers(layers: readonly DesignLayer[], result: FitResult): DesignLayer[] {
  return layers.map((layer, i) => ({ ...layer, thicknessNm: result.thicknessesNm[i] ?? layer.thicknessNm }));
}

/**
 * The layers of a Grow layers step as version layers. Materials come by name from the library;
 * a start layer whose material was not allowed is named `layers[i]` by the engine and keeps the
 * version's material of layer i. Throws naming the material that is not found.
 */
export function grownLayers(
  step: GrowStep,
  startLayers: readonly DesignLayer[],
  idsByName: ReadonlyMap<string, number>,
): DesignLayer[] {
  return step.layers.map((layer) => {
    const id = grownLayerMaterialId(
      layer.material,
      startLayers.map((l) => l.materialId),
      idsByName,
    );
    if (id === undefined) throw new Error(`material ${layer.material} is not in the library`);
    return { materialId: id, thicknessNm: layer.thicknessNm, locked: false, notes: '' };
  });
}

/** Centres of the worst-margin histogram's bins (edges has one more entry than counts). */
export function binCentres(edges: readonly number[]): number[] {
  const centres: number[] = [];
  for (let i = 0; i + 1 < edges.length; i++)
    centres.push((elementAt(edges, i, 'the bin edges') + elementAt(edges, i + 1, 'the bin edges')) / 2);
  return centres;
}

/** Why an engine run stopped, in words. */
export const STOP_REASONS: Record<string, string> = {
  converged: 'converged',
  maxIterations: 'reached the most iterations',
  cancelled: 'cancelled',
  maskMet: 'the mask is met',
  noImprovement: 'no needle lowered the merit further',
  maxLayers: 'reached the most layers',
  maxTotalThickness: 'reached the most total thickness',
  maxSteps: 'reached the most steps',
  completed: 'all trials run',
};
