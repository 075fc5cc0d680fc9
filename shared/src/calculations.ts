/*
 * Jobs of the compute queue and their results as the API and the client exchange them.
 */
import type { AnalysisSummary } from './analysis.js';
import type { FitResult } from './optimise/fit.js';

export const CALCULATION_STATUSES = ['queued', 'running', 'completed', 'failed', 'cancelled'] as const;
export type CalculationStatus = (typeof CALCULATION_STATUSES)[number];

/** What a job of the compute queue does: a full analysis, or one of the optimisations. */
export const CALCULATION_KINDS = ['analysis', 'fit', 'grow', 'yield', 'diagnosis'] as const;
export type CalculationKind = (typeof CALCULATION_KINDS)[number];

/** The kinds of job a design version keeps its latest result of (Run diagnosis belongs to a run). */
export const VERSION_CALCULATION_KINDS = ['analysis', 'fit', 'grow', 'yield'] as const;
export type VersionCalculationKind = (typeof VERSION_CALCULATION_KINDS)[number];

/** Streamed while an optimisation runs: merit per iteration (fit, diagnosis) or per layer count (grow). */
export interface LiveProgress {
  history: { iteration?: number; layerCount?: number; merit: number }[];
}

/** A job of the compute queue and, once done, the summary of its result. */
export interface CalculationView {
  id: number;
  kind: CalculationKind;
  status: CalculationStatus;
  /** 0 to 1. */
  progress: number;
  error: string | null;
  designId: number | null;
  versionNumber: number | null;
  /** An analysis's grid (AnalysisRequest), or an optimisation's options. */
  request: unknown;
  /** An analysis's AnalysisSummary, or an optimisation's result (FitResult, GrowResult, YieldForecast, diagnosis). */
  summary: AnalysisSummary | Record<string, unknown> | null;
  /** Merit history streamed while an optimisation runs. */
  live: LiveProgress | null;
  /** The chamber run a diagnosis belongs to. */
  runId: number | null;
  /** Display name of who asked for it. */
  createdBy: string;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  computeMs: number | null;
  processedBy: string | null;
  attempts: number;
}

/** One design layer as Run diagnosis found it. */
export interface LayerDeviation {
  /** Design layer, 1 = outermost (incident side). */
  layer: number;
  materialId: number;
  designNm: number;
  fittedNm: number;
  /** fitted ÷ design. */
  factor: number;
  deviationPercent: number;
  /**
   * Standard uncertainty of `factor`: the fit's (s²·(JᵀJ)⁻¹ at the solution) widened by the
   * unresolved spread of the unidentified layers it is correlated with (optimise/diagnosis.ts);
   * null where it cannot be estimated; absent in diagnoses made before uncertainties were kept
   * (and the fit's alone in those made before the widening).
   */
  factorSigma?: number | null;
  /** The fit's own linearised σ of `factor`, before the widening (absent in older diagnoses). */
  fitFactorSigma?: number | null;
  /**
   * The unidentified layer (1 = outermost) whose trade-off with this one widens its σ most, with
   * their correlation; null when none does (absent in older diagnoses).
   */
  correlatedWith?: { layer: number; correlation: number } | null;
  /**
   * Whether the spectrum identifies this layer: false for a layer on its factor bound or with a
   * factor σ (widened) above IDENTIFIABLE_MAX_FACTOR_SIGMA (a very thin layer, or one that trades
   * thickness with an unidentified neighbour).
   */
  identified?: boolean;
}

/** What a client reads of a completed Run diagnosis. */
export interface DiagnosisSummary {
  /** Ranked by |deviation|, largest first. */
  layers: LayerDeviation[];
  /** RMS difference between measured and fitted spectrum, percentage points. */
  residualRmsPercent: number;
}

/** The result of a Run diagnosis, stored as the calculation's summary. */
export interface DiagnosisResult extends DiagnosisSummary {
  fit: FitResult;
}

/**
 * Library material id of a layer of a Grow layers result. The engine names a layer after its
 * allowed material; a start layer whose material was not allowed keeps the name `layers[i]` (its
 * place in the start stack) and so maps back to the material of start layer i. Undefined when
 * neither applies.
 */
export function grownLayerMaterialId(
  name: string,
  startMaterialIds: readonly number[],
  idsByName: ReadonlyMap<string, number>,
): number | undefined {
  const id = idsByName.get(name);
  if (id !== undefined) return id;
  const start = /^layers\[(\d+)\]$/.exec(name);
  return start ? startMaterialIds[Number(start[1])] : undefined;
}

/** The latest completed calculation of each kind for a design version (null: none yet). */
export type LatestCalculations = Record<VersionCalculationKind, CalculationView | null>;
