/*
 * Chamber calibration learned from the run history: each diagnosed run gives, per material, the
 * tooling factor the chamber actually had (from Run diagnosis's fitted thicknesses); a small
 * Kalman filter follows that factor from run to run, and its estimate turns into a suggested new
 * tooling factor when it leaves the shop's threshold.
 *
 * Method: a local linear trend model (level + drift per run) — A. C. Harvey, Forecasting,
 * Structural Time Series Models and the Kalman Filter (Cambridge University Press, 1989), §2.3 and
 * §3.2 — filtered with the Kalman recursions, the innovation clipped by Huber's ψ so that a single
 * wild run moves the estimate by a bounded amount: C. J. Masreliez and R. D. Martin, "Robust
 * Bayesian estimation for the linear model and robustifying the Kalman filter", IEEE Trans. Autom.
 * Control 22, 361 (1977). Why this and not an EWMA chart (D. C. Montgomery, Introduction to
 * Statistical Quality Control, 7th ed., §9.2): runs come with very different uncertainties (a
 * run's factor rests on one thick layer or on four), which the filter weighs run by run, and a slow
 * drift is part of its model, so the estimate does not lag a steady drift the way an EWMA of
 * fixed λ does; it also gives the drift per run with its own uncertainty. The control limits are
 * those of the one-step prediction: predicted level ± 3·√(innovation variance), the Shewhart
 * 3-sigma rule (Montgomery, §5.3) applied to the innovations.
 *
 * The run-to-run scatter that the fit's own uncertainty does not cover (chamber, fixture, loading)
 * is estimated from the median moving range of the run values, σ ≈ MR̃/0.954 (Montgomery, §6.4,
 * individuals chart; the constant 0.954 from memory), and added to each run's variance.
 */
import { elementAt } from './checked.js';

/** A value with its standard uncertainty. */
export interface Measured {
  value: number;
  sigma: number;
}

/** Settings of the estimator and of the suggestions (a shop's settings, with defaults). */
export interface CalibrationSettings {
  /** A suggestion is made when the estimated correction differs from 1 by at least this, %. */
  thresholdPercent: number;
  /** Runs with data before any suggestion (common practice, no source). */
  minRuns: number;
  /** Level noise of the filter per run, relative (how much the factor may wander between runs). */
  levelNoisePerRun: number;
  /** Drift noise per run, relative per run (how fast the drift itself may change). */
  driftNoisePerRun: number;
  /** Huber clipping of the standardised innovation (Masreliez & Martin use 1.5–2). */
  huberClip: number;
  /** Control limits, in standard deviations of the innovation (Shewhart's 3-sigma). */
  limitSigma: number;
}

export const DEFAULT_CALIBRATION_SETTINGS: CalibrationSettings = {
  thresholdPercent: 1,
  minRuns: 4,
  levelNoisePerRun: 0.001,
  driftNoisePerRun: 0.0002,
  huberClip: 2,
  limitSigma: 3,
};

/**
 * A layer whose fitted thickness factor has a standard uncertainty above this is not identified
 * by its run's spectrum (a very thin layer, one with little index contrast to its neighbours,
 * e.g. SiO2 on glass, or one that trades thickness with such a layer — its σ widened as
 * optimise/diagnosis.ts explains) and is left out: a factor known only to ±1 % cannot support a
 * correction of the usual 1 % threshold (common practice, no source).
 */
export const IDENTIFIABLE_MAX_FACTOR_SIGMA = 0.01;

/** Smallest standard uncertainty a run's value is given, relative (common practice, no source). */
export const MIN_RUN_SIGMA = 0.001;

/** One run's place in the filtered series. */
export interface TrackedPoint extends Measured {
  /** Filtered level after this run. */
  estimate: number;
  estimateSigma: number;
  /** Drift per run after this run (relative per run). */
  driftPerRun: number;
  driftSigma: number;
  /** One-step prediction and its control limits; null for the first run. */
  predicted: number | null;
  limitLow: number | null;
  limitHigh: number | null;
  /** Outside the control limits of its prediction. */
  outOfControl: boolean;
}

/**
 * Inverse-variance weighted mean of values (e.g. the layers of one material in one run).
 * Throws on an empty list or a non-positive σ.
 */
export function weightedMean(values: readonly Measured[]): Measured {
  if (values.length === 0) throw new Error('weightedMean: no values');
  let sw = 0;
  let swx = 0;
  for (const v of values) {
    if (!(v.sigma > 0) || !Number.isFinite(v.value))
      throw new Error('weightedMean: needs finite values and σ > 0');
    const w = 1 / (v.sigma * v.sigma);
    sw += w;
    swx += w * v.value;
  }
  return { value: swx / sw, sigma: 1 / Math.sqrt(sw) };
}

/**
 * Run-to-run scatter beyond the stated uncertainties: √max(0, (MR̃/0.954)² − mean σ²), 0 for
 * fewer than three runs.
 */
export function scatterBetweenRuns(series: readonly Measured[]): number {
  if (series.length < 3) return 0;
  const ranges = series.slice(1).map((p, i) => Math.abs(p.value - elementAt(series, i, 'the series').value));
  ranges.sort((a, b) => a - b);
  const mid = ranges.length >> 1;
  const upper = elementAt(ranges, mid, 'the moving ranges');
  const median = ranges.length % 2 ? upper : (elementAt(ranges, mid - 1, 'the moving ranges') + upper) / 2;
  const total = median / 0.954;
  const stated = series.reduce((s, p) => s + p.sigma * p.sigma, 0) / series.length;
  return Math.sqrt(Math.max(0, total * total - stated));
}

/**
 * Filters a series of run values (oldest first) with the robust local linear trend filter of the
 * file comment; returns one point per run. Values are relative factors (≈ 1).
 */
export function trackCalibration(
  series: readonly Measured[],
  settings: CalibrationSettings = DEFAULT_CALIBRATION_SETTINGS,
): TrackedPoint[] {
  const tau = scatterBetweenRuns(series);
  const qLevel = settings.levelNoisePerRun ** 2;
  const qDrift = settings.driftNoisePerRun ** 2;
  const out: TrackedPoint[] = [];
  let level = 0;
  let drift = 0;
  let p11 = 0;
  let p12 = 0;
  let p22 = 0;
  series.forEach((obs, k) => {
    const sigma = Math.max(obs.sigma, MIN_RUN_SIGMA);
    const r = sigma * sigma + tau * tau;
    if (k === 0) {
      // Start: the level is the first run; the drift is unknown within a broad 1 %/run.
      level = obs.value;
      drift = 0;
      p11 = r;
      p12 = 0;
      p22 = 0.01 ** 2;
      out.push(point(obs, level, p11, drift, p22, null, null, false));
      return;
    }
    const predicted = level + drift;
    const m11 = p11 + 2 * p12 + p22 + qLevel;
    const m12 = p12 + p22;
    const m22 = p22 + qDrift;
    const s = m11 + r;
    const z = (obs.value - predicted) / Math.sqrt(s);
    const clipped = Math.max(-settings.huberClip, Math.min(settings.huberClip, z)) * Math.sqrt(s);
    const k1 = m11 / s;
    const k2 = m12 / s;
    level = predicted + k1 * clipped;
    drift = drift + k2 * clipped;
    p11 = m11 - (m11 * m11) / s;
    p12 = m12 - (m11 * m12) / s;
    p22 = m22 - (m12 * m12) / s;
    const half = settings.limitSigma * Math.sqrt(s);
    out.push(point(obs, level, p11, drift, p22, predicted, half, Math.abs(z) > settings.limitSigma));
  });
  return out;
}

function point(
  obs: Measured,
  level: number,
  p11: number,
  drift: number,
  p22: number,
  predicted: number | null,
  half: number | null,
  outOfControl: boolean,
): TrackedPoint {
  return {
    value: obs.value,
    sigma: obs.sigma,
    estimate: level,
    estimateSigma: Math.sqrt(Math.max(0, p11)),
    driftPerRun: drift,
    driftSigma: Math.sqrt(Math.max(0, p22)),
    predicted,
    limitLow: predicted === null || half === null ? null : predicted - half,
    limitHigh: predicted === null || half === null ? null : predicted + half,
    outOfControl,
  };
}

/** Why a run (or the estimate) is off. */
export type CalibrationCause = 'none' | 'material' | 'common';

/**
 * The cause a set of per-material factors points to: `common` when every material is off by the
 * same factor (within 2σ or half the threshold of their weighted mean, which is itself off by the
 * threshold) — a monitor
 * or geometry cause, not a material's; `material` when some material is off on its own; `none`.
 */
export function calibrationCause(factors: readonly Measured[], thresholdPercent: number): CalibrationCause {
  const off = (v: Measured) =>
    Math.abs(v.value - 1) * 100 >= thresholdPercent && Math.abs(v.value - 1) > 2 * v.sigma;
  if (factors.length >= 2) {
    const mean = weightedMean(
      factors.map((f) => ({ value: f.value, sigma: Math.max(f.sigma, MIN_RUN_SIGMA) })),
    );
    // Together: within 2σ of the mean, or within half the threshold of it (a difference too small
    // to act on per material; common practice, no source).
    const together = factors.every(
      (f) =>
        Math.abs(f.value - mean.value) <= 2 * Math.max(f.sigma, MIN_RUN_SIGMA) ||
        Math.abs(f.value - mean.value) * 100 <= thresholdPercent / 2,
    );
    if (together && factors.every(off) && off(mean)) return 'common';
  }
  return factors.some(off) ? 'material' : 'none';
}

/** A material's current estimate, as the suggestions read it. */
export interface MaterialEstimate {
  materialId: number;
  /** Runs that gave a value. */
  runs: number;
  /** Estimated correction: actual tooling factor ÷ the chamber's current one. */
  correction: Measured;
}

/** What the estimates point to: a new tooling factor for one material, or a common cause. */
export type CalibrationFinding =
  | { kind: 'material'; materialId: number; correction: Measured }
  | { kind: 'common'; materialIds: number[]; correction: Measured };

/**
 * Findings from the current estimates: every material with at least `minRuns` runs whose
 * correction is off by the threshold and by more than 2σ is a candidate. The finding is one common
 * (monitor or geometry) cause instead of per-material factors when two or more materials have
 * enough runs, all of them are candidates off in the same direction, and either their estimates
 * agree (see {@link calibrationCause}) or most of the recent runs (`recentCauses`, the causes of the
 * last runs, at least `minRuns` of them) each showed the same factor for all materials.
 */
export function calibrationFindings(
  estimates: readonly MaterialEstimate[],
  settings: CalibrationSettings = DEFAULT_CALIBRATION_SETTINGS,
  recentCauses: readonly CalibrationCause[] = [],
): CalibrationFinding[] {
  const ready = estimates.filter((e) => e.runs >= settings.minRuns);
  const off = (e: MaterialEstimate) =>
    Math.abs(e.correction.value - 1) * 100 >= settings.thresholdPercent &&
    Math.abs(e.correction.value - 1) > 2 * e.correction.sigma;
  const candidates = ready.filter(off);
  const allTogether =
    ready.length >= 2 &&
    candidates.length === ready.length &&
    (candidates.every((e) => e.correction.value > 1) || candidates.every((e) => e.correction.value < 1));
  const runsSayCommon =
    recentCauses.length >= settings.minRuns &&
    recentCauses.filter((c) => c === 'common').length * 2 > recentCauses.length;
  const estimatesSayCommon =
    allTogether &&
    calibrationCause(
      ready.map((e) => e.correction),
      settings.thresholdPercent,
    ) === 'common';
  if (allTogether && (estimatesSayCommon || runsSayCommon)) {
    return [
      {
        kind: 'common',
        materialIds: ready.map((e) => e.materialId),
        correction: weightedMean(
          ready.map((e) => ({ ...e.correction, sigma: Math.max(e.correction.sigma, MIN_RUN_SIGMA) })),
        ),
      },
    ];
  }
  return candidates.map((e) => ({ kind: 'material', materialId: e.materialId, correction: e.correction }));
}

/** A suggested tooling factor, rounded as chambers keep them (4 decimals). */
export function suggestedToolingFactor(current: number, correction: number): number {
  return Math.round(current * correction * 1e4) / 1e4;
}

// ---- What the API and the client exchange ----

/** One layer of a diagnosed run, as the calibration history shows it. */
export interface CalibrationLayerPoint {
  /** Design layer, 1 = outermost. */
  layer: number;
  /** Deposition step (1 = next to the substrate). */
  step: number;
  designNm: number;
  fittedNm: number;
  /**
   * fitted ÷ design, with its standard uncertainty (null: not estimated): the fit's own, widened
   * by the unidentified layers it trades thickness with (Run diagnosis).
   */
  factor: number;
  factorSigma: number | null;
  /** The fit's own σ before the widening (null: not estimated or not kept by the diagnosis). */
  fitFactorSigma: number | null;
  /**
   * The unidentified layer (design layer, 1 = outermost) whose trade-off with this one widens its
   * σ most, with their correlation; null: none.
   */
  correlatedWith: { layer: number; correlation: number } | null;
  /** False: too thin, or too correlated with an unidentified layer, to be identified; left out. */
  identified: boolean;
  /** What the operator entered for the step. */
  monitorThicknessNm: number | null;
  rateNmPerS: number | null;
  /** Actual tooling factor of the run (fitted on the part ÷ on the monitor), or null when left out. */
  impliedToolingFactor: number | null;
}

/** One diagnosed run's contribution to one material. */
export interface CalibrationRunPoint {
  runId: number;
  lotNumber: string;
  runDate: string;
  calculationId: number;
  /** Tooling factor the chamber had for the material when the run was made. */
  toolingFactorInEffect: number;
  layers: CalibrationLayerPoint[];
  /** Combined correction of the identified layers (actual ÷ current tooling factor); null: none identified. */
  correction: Measured | null;
  /** Entered rate ÷ the chamber's rate setting, mean of the steps with a rate; null: none entered. */
  rateRatio: number | null;
  /** The run's cause, over all its materials. */
  cause: CalibrationCause;
  /** Filter state after this run (null where the run gave no value). */
  tracked: TrackedPoint | null;
}

/** The history and estimate of one chamber × material. */
export interface CalibrationSeriesView {
  materialId: number;
  materialName: string;
  currentToolingFactor: number;
  runs: CalibrationRunPoint[];
  /** Latest estimate (null: no identified layer yet). */
  estimate: {
    correction: Measured;
    driftPercentPerRun: Measured;
    suggestedToolingFactor: number;
    runs: number;
  } | null;
  /** Latest estimate of entered ÷ set deposition rate, with its drift per run. */
  rate: { ratio: Measured; driftPercentPerRun: Measured; runs: number } | null;
}

/** A pending suggestion: what an engineer accepts or rejects, exactly as shown. */
export interface CalibrationSuggestionView {
  /** Identifies the suggestion and what it rests on; sent back with the decision. */
  key: string;
  kind: 'material' | 'common';
  /** The material (kind material), or every material that moved together (kind common). */
  materialIds: number[];
  correction: Measured;
  currentToolingFactor: number | null;
  proposedToolingFactor: number | null;
  /** Latest diagnosed run it rests on. */
  lastRunId: number;
  message: string;
}

/** An accepted or rejected suggestion. */
export interface CalibrationDecisionView {
  id: number;
  chamberId: number;
  kind: 'material' | 'common';
  materialIds: number[];
  decision: 'accepted' | 'rejected';
  previousToolingFactor: number | null;
  newToolingFactor: number | null;
  correction: Measured;
  lastRunId: number;
  comment: string;
  decidedBy: string;
  decidedAt: string;
}

/** Everything the Chambers page shows of a chamber's calibration. */
export interface ChamberCalibrationView {
  chamberId: number;
  settings: CalibrationSettings;
  series: CalibrationSeriesView[];
  suggestions: CalibrationSuggestionView[];
  decisions: CalibrationDecisionView[];
}

/** The calibration a run sheet's tooling factors come from, per material. */
export interface RunSheetCalibration {
  chamberVersion: number;
  materials: {
    material: string;
    toolingFactor: number;
    /** The accepted calibration that set it, or null: the chamber's own setting. */
    decision: { id: number; decidedAt: string; decidedBy: string } | null;
  }[];
}

/** Longest comment on a calibration decision, characters. */
export const CALIBRATION_COMMENT_MAX_LENGTH = 2000;

/** One line naming the calibration behind a run sheet's tooling factors, for the materials it uses. */
export function runSheetCalibrationLine(
  calibration: RunSheetCalibration,
  materials: readonly string[],
): string {
  const used = new Set(materials);
  const parts = calibration.materials
    .filter((m) => used.has(m.material))
    .map((m) =>
      m.decision
        ? `${m.material} ${m.toolingFactor} (calibration #${m.decision.id}, accepted ${m.decision.decidedAt.slice(0, 10)} by ${m.decision.decidedBy})`
        : `${m.material} ${m.toolingFactor} (chamber setting)`,
    );
  return `Tooling factors from chamber version ${calibration.chamberVersion}: ${parts.join('; ')}.`;
}
