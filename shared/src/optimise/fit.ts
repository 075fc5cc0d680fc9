/*
 * Fit to mask: damped least squares (K. Levenberg, Q. Appl. Math. 2, 164 (1944); D. W. Marquardt,
 * J. SIAM 11, 431 (1963)) over the thicknesses of the unlocked front layers, minimising the mask
 * merit of merit.ts (plus optional target curves), with per-layer bounds.
 *
 * Why our own implementation and not the npm package `ml-levenberg-marquardt` (5.1.0, the one
 * general-purpose LM on npm): its model is a scalar function f(params)(x) per data point and it
 * takes no per-iteration callback, so it could neither stream the merit of each iteration nor be
 * cancelled between iterations; it builds new ml-matrix objects every iteration; its bounds are a
 * plain clamp after the step, without freezing the layers that sit on a bound and push outwards,
 * so a step keeps being spent on them. The problem here is small (one unknown per free layer, a
 * few tens at most), so the normal equations solved by Cholesky are a few dozen lines, and this
 * way the Jacobian comes straight from the engine's batch API into buffers allocated once.
 *
 * Method, per iteration:
 * - Jacobian from the analytic thickness derivatives of optics/derivatives.ts (one forward and one
 *   backward matrix sweep for all layers), or, for back `incoherent` or on request, by forward
 *   differences, one extra spectrum per free layer (step FD_STEP_NM).
 * - Bounds by projection: a layer on a bound whose gradient points outwards is frozen for the
 *   iteration; the step of the others is solved from (JᵀJ + λ·diag JᵀJ)·δ = −Jᵀr and clipped.
 * - No thickness moves more than MAX_STEP_NM in one step (the step is shortened along its
 *   direction). λ falls by 3 after a step that lowers Σr², rises by 4 after one that does not
 *   (Marquardt's scaled damping). Everything is deterministic: the same input gives the same iterates.
 */
import type { ResultForecast } from './result-forecast.js';
import { oneOf, onlyKeys, plainObject } from '../optics/checks.js';
import { OpticsInputError, fieldPath } from '../optics/errors.js';
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import type { BackSurface } from '../optics/batch.js';
import { createMaskMerit, type MaskMerit, type TargetCurve } from './merit.js';
import { nonNegativeOption, wholeNumber } from './options.js';

/** Default lower bound on a fitted layer, nm (thinner layers are hard to build reliably). */
export const DEFAULT_MIN_THICKNESS_NM = 10;
/** Default upper bound on a fitted layer, nm. */
export const DEFAULT_MAX_THICKNESS_NM = 1000;
/** Default most iterations of a fit (and of each Grow layers refinement). */
export const DEFAULT_MAX_ITERATIONS = 100;
/** Default tightening of max/min limits while fitting, percentage points. */
export const DEFAULT_MARGIN_PERCENT = 0.001;
/**
 * Target margin the optimisation forms start from, percentage points: the design is refined until
 * every mask sample clears its limit by this much, not merely until it passes (common practice,
 * no source: a tenth of a point absorbs run-to-run scatter on visible AR).
 */
export const DEFAULT_TARGET_MARGIN_PERCENT = 0.1;
/** Largest target margin the API takes, percentage points. */
export const MAX_TARGET_MARGIN_PERCENT = 5;
/** Forward-difference step of the Jacobian, nm. */
const FD_STEP_NM = 1e-6;
const LAMBDA_START = 1e-3;
const LAMBDA_MIN = 1e-12;
const LAMBDA_GIVE_UP = 1e12;
/**
 * Largest thickness change of one step, nm: a longer step is shortened along its direction. The
 * spectrum's linearisation holds over a fraction of a quarter wave, and without the cap a thin
 * layer (whose merit changes slowly) can be thrown across several periods in one step.
 */
const MAX_STEP_NM = 25;
/** Converged when no thickness moved more than this in an accepted step, nm. */
const STEP_TOLERANCE_NM = 1e-7;
/** Converged when an accepted step lowers Σr² by less than this fraction. */
const REDUCTION_TOLERANCE = 1e-14;

const FIT_OPTION_KEYS = [
  'back',
  'locked',
  'minThicknessNm',
  'maxThicknessNm',
  'maxIterations',
  'targets',
  'marginPercent',
  'onIteration',
  'derivatives',
];

/** Streamed after every accepted iteration. */
export interface FitIteration {
  iteration: number;
  /** Mask merit (with targets), percentage points, without the fitting margin. */
  merit: number;
  /** All front layers, nm (locked ones unchanged). */
  thicknessesNm: number[];
}

export interface FitOptions {
  /** Substrate treatment (default `none`). */
  back?: BackSurface;
  /** Per front layer: true keeps its thickness. Default: all unlocked. */
  locked?: boolean[];
  /** Lower bound, nm: one value for all layers or one per layer (default 10). */
  minThicknessNm?: number | number[];
  /** Upper bound, nm: one value or one per layer (default 1000). */
  maxThicknessNm?: number | number[];
  /** Most iterations (default 100; 1–100000). */
  maxIterations?: number;
  /** Target curves fitted together with the mask. */
  targets?: TargetCurve[];
  /** Max/min limits are tightened by this much while fitting (default 0.001 percentage points). */
  marginPercent?: number;
  /** Called after each iteration; return false to stop (cancel). */
  onIteration?: (info: FitIteration) => boolean | void;
  /**
   * How the Jacobian is taken: `analytic` (default; from the characteristic-matrix sweeps, for
   * back `none`) or `differences` (forward differences, one spectrum per free layer; always used
   * for back `incoherent`).
   */
  derivatives?: DerivativeMethod;
}

/** Jacobian from the analytic sweeps or from forward differences of the spectrum. */
export type DerivativeMethod = 'analytic' | 'differences';
export const DERIVATIVE_METHODS: readonly DerivativeMethod[] = ['analytic', 'differences'];

export type FitStop = 'converged' | 'maxIterations' | 'cancelled';

export interface FitResult {
  /** Fitted thicknesses of all front layers, nm. */
  thicknessesNm: number[];
  /** The thicknesses it started from, nm (for a before/after table). */
  initialThicknessesNm: number[];
  /** Mask merit (with targets), percentage points, before and after. */
  merit: { before: number; after: number };
  /** Whether the fitted stack meets the mask, and its worst margin (percentage points). */
  pass: boolean;
  worstMargin: number;
  iterations: number;
  /** Spectra computed, Jacobian columns included. */
  evaluations: number;
  /** Merit per iteration; iteration 0 is the start (after moving layers into their bounds). */
  history: { iteration: number; merit: number }[];
  converged: boolean;
  stoppedBy: FitStop;
  /** The margin the fit aimed for (limits tightened by it), percentage points; absent in older results. */
  targetMarginPercent?: number;
  /**
   * Yield forecast of the result under RESULT_FORECAST's thickness error, added by the compute
   * queue after the optimisation; absent in older results and when the job was cancelled.
   */
  forecast?: ResultForecast | null;
}

/** Bounds and lock per front layer, as the refinement uses them. */
export interface LayerBounds {
  minNm: Float64Array;
  maxNm: Float64Array;
  locked: Uint8Array;
}

/** Settings of {@link refineThicknesses}. */
export interface RefineSettings {
  maxIterations: number;
  /** Default `analytic` where the merit supports it. */
  derivatives?: DerivativeMethod;
  onIteration?: (info: FitIteration) => boolean | void;
}

/**
 * Refines the front-layer thicknesses of `stack` against `mask` (see the file comment for the
 * method). Unlocked layers outside their bounds start from the nearest bound. Throws
 * {@link OpticsInputError} naming the field for a stack without layers, every layer locked,
 * bounds with min > max, an empty or bad mask, or bad options.
 */
export function fitToMask(stack: OpticalStack, mask: SpecMask, options: FitOptions = {}): FitResult {
  const opts = plainObject(options, '');
  onlyKeys(opts, FIT_OPTION_KEYS, '');
  const layerCount = Array.isArray(stack?.layers) ? stack.layers.length : 0;
  if (layerCount === 0) throw new OpticsInputError('layers', 'the stack has no layers to fit');
  const bounds = layerBounds(layerCount, opts.minThicknessNm, opts.maxThicknessNm, opts.locked);
  const maxIterations = wholeNumber(opts.maxIterations, 'maxIterations', 1, 100_000, DEFAULT_MAX_ITERATIONS);
  if (opts.onIteration !== undefined && typeof opts.onIteration !== 'function') {
    throw new OpticsInputError('onIteration', 'must be a function');
  }
  const derivatives =
    opts.derivatives === undefined ? undefined : oneOf(opts.derivatives, DERIVATIVE_METHODS, 'derivatives');
  const targetMarginPercent = options.marginPercent ?? DEFAULT_MARGIN_PERCENT;
  const merit = createMaskMerit(stack, mask, {
    back: options.back,
    targets: options.targets,
    marginPercent: targetMarginPercent,
  });
  const start = merit.plan.stack.layers.map((l) => l.thicknessNm);
  const result = refineThicknesses(merit, start, bounds, {
    maxIterations,
    onIteration: options.onIteration,
    derivatives,
  });
  return { ...result, targetMarginPercent };
}

/**
 * Checks and expands per-layer bounds and locks: scalars apply to every layer, arrays must have
 * one value per layer. Throws {@link OpticsInputError} naming the field.
 */
export function layerBounds(
  layerCount: number,
  minInput: unknown,
  maxInput: unknown,
  lockedInput: unknown,
): LayerBounds {
  const expand = (input: unknown, field: string, fallback: number): Float64Array => {
    const out = new Float64Array(layerCount);
    if (input === undefined) return out.fill(fallback);
    if (Array.isArray(input)) {
      if (input.length !== layerCount) {
        throw new OpticsInputError(field, `needs one value per layer (${layerCount}, got ${input.length})`);
      }
      input.forEach((v, i) => (out[i] = thickness(v, fieldPath(field, i))));
      return out;
    }
    return out.fill(thickness(input, field));
  };
  const minNm = expand(minInput, 'minThicknessNm', DEFAULT_MIN_THICKNESS_NM);
  const maxNm = expand(maxInput, 'maxThicknessNm', DEFAULT_MAX_THICKNESS_NM);
  for (let i = 0; i < layerCount; i++) {
    if (minNm[i] > maxNm[i]) {
      const field = Array.isArray(minInput) ? fieldPath('minThicknessNm', i) : 'minThicknessNm';
      throw new OpticsInputError(
        field,
        `must not exceed maxThicknessNm (${minNm[i]} nm > ${maxNm[i]} nm${Array.isArray(minInput) || Array.isArray(maxInput) ? ` for layer ${i}` : ''})`,
      );
    }
  }
  const locked = new Uint8Array(layerCount);
  if (lockedInput !== undefined) {
    if (!Array.isArray(lockedInput) || lockedInput.length !== layerCount) {
      throw new OpticsInputError(
        'locked',
        `must be a list of ${layerCount} true/false values, one per layer`,
      );
    }
    lockedInput.forEach((v, i) => {
      if (typeof v !== 'boolean') throw new OpticsInputError(fieldPath('locked', i), 'must be true or false');
      locked[i] = v ? 1 : 0;
    });
    if (locked.every((v) => v === 1)) {
      throw new OpticsInputError('locked', 'every layer is locked: unlock at least one layer to fit');
    }
  }
  return { minNm, maxNm, locked };
}

/**
 * Buffers of one refinement, allocated once: the free layers and their bounds, the iterate and a
 * trial, residuals, the Jacobian, the normal equations and the secant term.
 */
interface LmWork {
  free: number[];
  lo: Float64Array;
  hi: Float64Array;
  x: Float64Array;
  trial: Float64Array;
  r: Float64Array;
  rTrial: Float64Array;
  jac: Float64Array;
  /** JᵀJ and Jᵀr. */
  a: Float64Array;
  g: Float64Array;
  /** The Jacobian's non-zero rows, column by column ([j·m + row]), and their residuals. */
  columns: Float64Array;
  rUsed: Float64Array;
  /** 1 for a layer that moves this iteration, 0 for one frozen on its bound. */
  active: Uint8Array;
  sub: Float64Array;
  rhs: Float64Array;
  step: Float64Array;
  /** Secant term S ≈ Σ r_s ∇²r_s (second-order part of the Hessian of Σr²/2) and its update's inputs. */
  sec: Float64Array;
  gPrev: Float64Array;
  jtrNew: Float64Array;
  sStep: Float64Array;
  y: Float64Array;
  ySharp: Float64Array;
  scratch: Float64Array;
  haveStep: boolean;
}

function createLmWork(merit: MaskMerit, bounds: LayerBounds, startNm: ArrayLike<number>): LmWork {
  const L = merit.layerCount;
  const m = merit.sampleCount;
  const free: number[] = [];
  for (let i = 0; i < L; i++) if (bounds.locked[i] === 0) free.push(i);
  const p = free.length;
  const lo = Float64Array.from(free, (l) => bounds.minNm[l]);
  const hi = Float64Array.from(free, (l) => bounds.maxNm[l]);
  const x = Float64Array.from(startNm);
  for (let j = 0; j < p; j++) x[free[j]] = Math.min(hi[j], Math.max(lo[j], x[free[j]]));
  const f = (n: number) => new Float64Array(n);
  return {
    free,
    lo,
    hi,
    x,
    trial: f(L),
    r: f(m),
    rTrial: f(m),
    jac: f(m * p),
    a: f(p * p),
    g: f(p),
    columns: f(m * p),
    rUsed: f(m),
    active: new Uint8Array(p),
    sub: f(p * p),
    rhs: f(p),
    step: f(p),
    sec: f(p * p),
    gPrev: f(p),
    jtrNew: f(p),
    sStep: f(p),
    y: f(p),
    ySharp: f(p),
    scratch: f(p),
    haveStep: false,
  };
}

/**
 * The refinement itself, on a prepared merit (used by Fit to mask and Grow layers). `startNm`
 * holds every front layer of the merit's plan; the result's thicknesses too. On return the merit's
 * spectrum is that of the result's thicknesses.
 */
export function refineThicknesses(
  merit: MaskMerit,
  startNm: ArrayLike<number>,
  bounds: LayerBounds,
  settings: RefineSettings,
): FitResult {
  const initial = Array.from(startNm);
  const w = createLmWork(merit, bounds, initial);
  const { x, r, trial, rTrial } = w;
  const analytic = (settings.derivatives ?? 'analytic') === 'analytic' && merit.analyticDerivatives;

  merit.compute(initial);
  const meritBefore = merit.meritOf();
  let evaluations = 1;
  // The start's spectrum serves for the iterate too unless a layer was moved into its bounds.
  let clipped = false;
  for (let i = 0; i < x.length; i++) if (x[i] !== initial[i]) clipped = true;
  let sum = clipped ? merit.residuals(r, x) : merit.residualsOf(r, true);
  if (clipped) evaluations++;
  // Whether the merit's spectrum is that of x (not of a trial or a difference step).
  let atX = true;
  let current = merit.meritOf();
  const history = [{ iteration: 0, merit: current }];
  let lambda = LAMBDA_START;
  let iterations = 0;
  let stoppedBy: FitStop = 'maxIterations';

  outer: while (iterations < settings.maxIterations) {
    if (sum === 0) {
      stoppedBy = 'converged';
      break;
    }
    if (analytic) {
      merit.jacobian(w.jac, x, w.free);
      evaluations++;
    } else {
      evaluations += jacobianByDifferences(merit, w.jac, x, r, w.free, trial, rTrial);
      atX = false;
    }
    normalEquations(w, merit.sampleCount);
    if (w.haveStep) updateSecant(w);
    const nActive = freezeOnBounds(w);
    if (nActive === 0) {
      stoppedBy = 'converged';
      break;
    }
    for (;;) {
      if (solveDampedStep(w, nActive, lambda)) {
        const moved = trialPoint(w);
        const sumTrial = merit.residuals(rTrial, trial);
        evaluations++;
        atX = sumTrial < sum;
        if (sumTrial < sum) {
          const reduction = (sum - sumTrial) / sum;
          rememberStep(w, merit.sampleCount);
          x.set(trial);
          r.set(rTrial);
          sum = sumTrial;
          current = merit.meritOf();
          lambda = Math.max(LAMBDA_MIN, lambda / 3);
          iterations++;
          history.push({ iteration: iterations, merit: current });
          const go = settings.onIteration?.({
            iteration: iterations,
            merit: current,
            thicknessesNm: Array.from(x),
          });
          if (go === false) {
            stoppedBy = 'cancelled';
            break outer;
          }
          if (sum === 0 || moved < STEP_TOLERANCE_NM || reduction < REDUCTION_TOLERANCE) {
            stoppedBy = 'converged';
            break outer;
          }
          continue outer;
        }
        if (moved < STEP_TOLERANCE_NM && lambda > 1) {
          // The damped step no longer moves anything measurable: a (bounded) local minimum.
          stoppedBy = 'converged';
          break outer;
        }
      }
      lambda *= 4;
      if (lambda > LAMBDA_GIVE_UP) {
        stoppedBy = 'converged';
        break outer;
      }
    }
  }

  if (!atX) {
    merit.compute(x);
    evaluations++;
  }
  const after = merit.meritOf();
  const worstMargin = merit.worstMarginOf();
  return {
    thicknessesNm: Array.from(x),
    initialThicknessesNm: initial,
    merit: { before: meritBefore, after },
    pass: worstMargin >= 0,
    worstMargin,
    iterations,
    evaluations,
    history,
    converged: stoppedBy === 'converged',
    stoppedBy,
  };
}

/**
 * A = JᵀJ (symmetric, both halves) and g = Jᵀr over the m samples. Rows that are zero (limit
 * samples that are met) are left out; the others are gathered column by column, so each entry of
 * the lower half is one dot product over the samples (in sample order, as a row-by-row sum), four
 * entries at a time.
 */
function normalEquations(w: LmWork, m: number): void {
  const { a, g, jac, r, columns, rUsed } = w;
  const p = w.free.length;
  let n = 0;
  for (let s = 0; s < m; s++) {
    const row = s * p;
    let j = 0;
    while (j < p && jac[row + j] === 0) j++;
    if (j === p) continue;
    for (let k = 0; k < p; k++) columns[k * m + n] = jac[row + k];
    rUsed[n] = r[s];
    n++;
  }
  for (let j = 0; j < p; j++) {
    const cj = j * m;
    let v = 0;
    for (let q = 0; q < n; q++) v += columns[cj + q] * rUsed[q];
    g[j] = v;
    let k = 0;
    for (; k + 3 <= j; k += 4) {
      const c0 = k * m;
      const c1 = c0 + m;
      const c2 = c1 + m;
      const c3 = c2 + m;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let q = 0; q < n; q++) {
        const x = columns[cj + q];
        s0 += x * columns[c0 + q];
        s1 += x * columns[c1 + q];
        s2 += x * columns[c2 + q];
        s3 += x * columns[c3 + q];
      }
      a[j * p + k] = s0;
      a[j * p + k + 1] = s1;
      a[j * p + k + 2] = s2;
      a[j * p + k + 3] = s3;
    }
    for (; k <= j; k++) {
      const ck = k * m;
      let s0 = 0;
      for (let q = 0; q < n; q++) s0 += columns[cj + q] * columns[ck + q];
      a[j * p + k] = s0;
    }
  }
  for (let j = 0; j < p; j++) for (let k = 0; k < j; k++) a[k * p + j] = a[j * p + k];
}

/** y = g₊ − g, y♯ = (J₊ − J)ᵀ r₊ = g₊ − Jᵀ r₊ (J from the previous point), then the update. */
function updateSecant(w: LmWork): void {
  const p = w.free.length;
  for (let j = 0; j < p; j++) {
    w.y[j] = w.g[j] - w.gPrev[j];
    w.ySharp[j] = w.g[j] - w.jtrNew[j];
  }
  secantUpdate(w.sec, w.sStep, w.y, w.ySharp, w.scratch, p);
}

/**
 * Marks the layers that move this iteration: one on a bound whose descent direction (−g) points
 * outwards stays there. Returns how many move.
 */
function freezeOnBounds(w: LmWork): number {
  const { x, g, lo, hi, free, active } = w;
  let nActive = 0;
  for (let j = 0; j < free.length; j++) {
    const v = x[free[j]];
    const out = (v <= lo[j] && g[j] > 0) || (v >= hi[j] && g[j] < 0) || g[j] === 0;
    active[j] = out ? 0 : 1;
    if (!out) nActive++;
  }
  return nActive;
}

/**
 * Solves (A + S + λ·diag A)·δ = −g on the moving layers into w.step (zero for frozen ones), the
 * diagonal floored at 1e-12 of its largest entry, and shortens δ to MAX_STEP_NM along its
 * direction. Returns false when the system is not positive definite.
 */
function solveDampedStep(w: LmWork, nActive: number, lambda: number): boolean {
  const { a, sec, g, active, sub, rhs, step } = w;
  const p = w.free.length;
  let maxDiag = 0;
  for (let j = 0; j < p; j++) if (active[j] === 1) maxDiag = Math.max(maxDiag, a[j * p + j]);
  const diagFloor = maxDiag > 0 ? maxDiag * 1e-12 : 1e-12;
  let q = 0;
  for (let j = 0; j < p; j++) {
    if (active[j] === 0) continue;
    let c = 0;
    for (let k = 0; k < p; k++) {
      if (active[k] === 0) continue;
      sub[q * nActive + c] = a[j * p + k] + sec[j * p + k];
      c++;
    }
    sub[q * nActive + q] += lambda * Math.max(a[j * p + j], diagFloor);
    rhs[q] = -g[j];
    q++;
  }
  if (!choleskySolve(sub, rhs, nActive)) return false;
  step.fill(0);
  q = 0;
  let longest = 0;
  for (let j = 0; j < p; j++) {
    if (active[j] === 1) step[j] = rhs[q++];
    longest = Math.max(longest, Math.abs(step[j]));
  }
  if (longest > MAX_STEP_NM) for (let j = 0; j < p; j++) step[j] *= MAX_STEP_NM / longest;
  return true;
}

/** trial = x + step clipped to the bounds; returns the largest thickness change, nm. */
function trialPoint(w: LmWork): number {
  const { x, trial, step, lo, hi, free } = w;
  trial.set(x);
  let moved = 0;
  for (let j = 0; j < free.length; j++) {
    const l = free[j];
    const v = Math.min(hi[j], Math.max(lo[j], x[l] + step[j]));
    moved = Math.max(moved, Math.abs(v - x[l]));
    trial[l] = v;
  }
  return moved;
}

/** Keeps what the secant update needs once the Jacobian at the accepted trial is known. */
function rememberStep(w: LmWork, m: number): void {
  const { x, trial, free, g, jac, rTrial } = w;
  const p = free.length;
  for (let j = 0; j < p; j++) {
    w.sStep[j] = trial[free[j]] - x[free[j]];
    w.gPrev[j] = g[j];
    let v = 0;
    for (let s = 0; s < m; s++) v += jac[s * p + j] * rTrial[s];
    w.jtrNew[j] = v;
  }
  w.haveStep = true;
}

/**
 * Jacobian J[s, j] = ∂r_s/∂d_free[j] by forward differences (step FD_STEP_NM) around x, whose
 * residuals are r; returns the spectra computed (one per free layer).
 */
function jacobianByDifferences(
  merit: MaskMerit,
  jac: Float64Array,
  x: Float64Array,
  r: Float64Array,
  free: readonly number[],
  trial: Float64Array,
  rTrial: Float64Array,
): number {
  const p = free.length;
  const m = merit.sampleCount;
  trial.set(x);
  for (let j = 0; j < p; j++) {
    const l = free[j];
    trial[l] = x[l] + FD_STEP_NM;
    merit.residuals(rTrial, trial);
    trial[l] = x[l];
    for (let s = 0; s < m; s++) jac[s * p + j] = (rTrial[s] - r[s]) / FD_STEP_NM;
  }
  return p;
}

/**
 * Structured secant update of S ≈ Σ r ∇²r (J. E. Dennis, D. M. Gay, R. E. Welsch, ACM TOMS 7, 348
 * (1981)): S is first sized by τ = min(1, |sᵀy♯| / |sᵀSs|), then
 * S₊ = S + ((y♯ − Ss)yᵀ + y(y♯ − Ss)ᵀ)/(yᵀs) − ((y♯ − Ss)ᵀs)·yyᵀ/(yᵀs)². Skipped unless yᵀs > 0.
 * With small residuals y♯ → 0 and S fades away, leaving Gauss–Newton; with a non-zero minimum
 * (e.g. a single sample and two layers) S supplies the curvature Gauss–Newton lacks.
 */
function secantUpdate(
  sec: Float64Array,
  s: Float64Array,
  y: Float64Array,
  ySharp: Float64Array,
  work: Float64Array,
  p: number,
): void {
  let ys = 0;
  let sy = 0;
  for (let j = 0; j < p; j++) {
    ys += y[j] * s[j];
    sy += s[j] * ySharp[j];
  }
  if (!(ys > 0)) return;
  let sSs = 0;
  for (let j = 0; j < p; j++) {
    let v = 0;
    for (let k = 0; k < p; k++) v += sec[j * p + k] * s[k];
    work[j] = v;
    sSs += s[j] * v;
  }
  const tau = sSs !== 0 ? Math.min(1, Math.abs(sy) / Math.abs(sSs)) : 1;
  let ws = 0;
  for (let j = 0; j < p; j++) {
    work[j] = ySharp[j] - tau * work[j];
    ws += work[j] * s[j];
  }
  for (let j = 0; j < p; j++) {
    for (let k = 0; k < p; k++) {
      sec[j * p + k] =
        tau * sec[j * p + k] + (work[j] * y[k] + y[j] * work[k]) / ys - (ws * y[j] * y[k]) / (ys * ys);
    }
  }
}

/**
 * Solves the symmetric positive definite n×n system a·x = b in place (b receives x) by Cholesky
 * factorisation (a is overwritten with its factor). Returns false when a is not positive definite.
 */
function choleskySolve(a: Float64Array, b: Float64Array, n: number): boolean {
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
    if (!(d > 0)) return false;
    const ljj = Math.sqrt(d);
    a[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
      a[i * n + j] = s / ljj;
    }
  }
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= a[i * n + k] * b[k];
    b[i] = s / a[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = i + 1; k < n; k++) s -= a[k * n + i] * b[k];
    b[i] = s / a[i * n + i];
  }
  return true;
}

function thickness(value: unknown, field: string): number {
  return nonNegativeOption(value, field, 0);
}
