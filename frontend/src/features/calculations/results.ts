/*
 * How the panel reads the summaries of Fit to mask, Grow layers and Yield forecast (the engine's
 * FitResult, GrowResult and YieldForecast, stored as JSON) and turns them into table rows.
 */
import {
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
  /** 1 = incident side. */
  layer: number;
  before: TableLayer | null;
  after: TableLayer | null;
  /** after − before, nm, when the layer exists on both sides in the same material. */
  changeNm: number | null;
}

/** Row by row: the version's layers against the result's (Grow may add or remove layers). */
export function thicknessRows(before: readonly TableLayer[], after: readonly TableLayer[]): ThicknessRow[] {
  const count = Math.max(before.length, after.length);
  const rows: ThicknessRow[] = [];
  for (let i = 0; i < count; i++) {
    const b = before[i] ?? null;
    const a = after[i] ?? null;
    rows.push({
      layer: i + 1,
      before: b,
      after: a,
      changeNm: a && b && a.material === b.material ? a.thicknessNm - b.thicknessNm : null,
    });
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
  for (let i = 0; i + 1 < edges.length; i++) centres.push((edges[i] + edges[i + 1]) / 2);
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
