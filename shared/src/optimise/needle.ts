/*
 * Grow layers: the needle method (A. V. Tikhonravov, M. K. Trubetskov, G. W. DeBell, Appl. Opt. 35,
 * 5493 (1996)). Each step
 * 1. scans where a thin layer (a needle) of each allowed material lowers the merit fastest: for
 *    every layer, positions every `positionStepNm` through it (its two interfaces included), the
 *    derivative of Σr² with respect to the needle's thickness (the perturbation function of the
 *    paper: analytic from the characteristic-matrix sweeps, or by probing with a NEEDLE_PROBE_NM
 *    needle);
 * 2. inserts needles at the deepest separate minima of that function together (up to
 *    `needlesPerStep`), refines all thicknesses with ≥ 0 bounds, removes layers that end up thinner
 *    than the minimum (merging neighbours of one material) and refines again within [min, max];
 *    when that does not lower the merit, single needles at the best positions are tried;
 * 3. keeps the step when the merit fell (else tries the next candidates), and repeats until the
 *    mask is met, nothing helps, or a limit is reached (layer count, total thickness, steps).
 * When no needle lowers the merit on its own (a refined single quarter wave is such a design: a
 * needle helps there only together with a change of the other layers), a whole layer of each
 * allowed material is tried at the front and next to the substrate, starting from the minimum
 * thickness, a quarter and a half wave at the mask's centre wavelength, refined within [min, max];
 * the best that lowers the merit is kept (the gradual-evolution variant of the method).
 *
 * With `growthMerit: 'smooth'` the structure grows on a smooth merit instead (every mask sample
 * pulls towards R = 0 under a maximum, merit.ts), with ≥ 0 bounds: layers thinner than
 * GROWTH_REMOVAL_NM are removed as they vanish, thin ones may stay while growing (the growing
 * structure may then hold up to GROWING_LAYERS_FACTOR × maxLayers layers). Each step's
 * design is then fitted to the one-sided mask merit with the target margin within [min, max]
 * (layers under the minimum raised to it, or removed, whichever fits better): that design is the
 * step's record, keeps to maxLayers and decides whether the mask is met. Once the design is needle-optimal (the needle
 * function ≥ 0 everywhere) and no whole layer helps, a half-wave layer is added next to the
 * substrate even though it does not lower the merit at once (gradual evolution: the total
 * thickness bounds what needles can reach, as the 1996 paper above shows); after MAX_THICKENINGS
 * such steps in a row without a better fitted design growth stops, and the result is the best
 * fitted design.
 */
import type { ResultForecast } from './result-forecast.js';
import { onlyKeys, plainObject } from '../optics/checks.js';
import { evaluateIndex, indexAt, validateMaterialModel, type MaterialModel } from '../optics/dispersion.js';
import { createNeedleGrid, needleFunction, type NeedleMaterials } from '../optics/derivatives.js';
import { oneOf } from '../optics/checks.js';
import { OpticsInputError, fieldPath } from '../optics/errors.js';
import { maskGrid, type SpecMask } from '../optics/mask.js';
import { validateOpticalStack, type OpticalStack } from '../optics/stack.js';
import type { BackSurface } from '../optics/batch.js';
import {
  DERIVATIVE_METHODS,
  DEFAULT_MARGIN_PERCENT,
  type DerivativeMethod,
  DEFAULT_MAX_ITERATIONS,
  DEFAULT_MAX_THICKNESS_NM,
  DEFAULT_MIN_THICKNESS_NM,
  layerBounds,
  refineThicknesses,
} from './fit.js';
import { createMaskMerit, type MaskMerit, type TargetCurve } from './merit.js';
import {
  DEFAULT_GROWTH_MERIT,
  DEFAULT_NEEDLES_PER_STEP,
  NEEDLE_DEPTH_FRACTION,
  nonNegativeOption,
  positiveOption,
  wholeNumber,
} from './options.js';

/** Default most front layers of a grown design. */
export const DEFAULT_MAX_LAYERS = 30;
/** Default most total physical thickness of a grown design, nm. */
export const DEFAULT_MAX_TOTAL_THICKNESS_NM = 5000;
/** Default most insertion steps. */
export const DEFAULT_MAX_STEPS = 30;

/** Thickness of the probing needle for the derivative, nm. */
const NEEDLE_PROBE_NM = 1e-3;
/**
 * Layers thinner than this are removed while growing on the smooth merit, nm: a needle that does
 * not grow past it is not worth a layer (common practice, no source).
 */
const GROWTH_REMOVAL_NM = 0.5;
/**
 * Thickenings in a row (see thicken()) that may fail to improve the best fitted design before
 * growing on the smooth merit stops (common practice, no source).
 */
const MAX_THICKENINGS = 3;
/**
 * How far below the target margin a step's worst margin may be and still count as reached,
 * percentage points: far below any measurement, above the refinement's convergence noise.
 */
const REACHED_TOLERANCE_PERCENT = 1e-6;
/**
 * On the smooth merit a growing structure may hold this many times maxLayers layers, the thin
 * ones kept while growing included; the fitted design of each step keeps to maxLayers (common
 * practice, no source).
 */
const GROWING_LAYERS_FACTOR = 2;
/** Candidates (distinct layer and material) tried per step before giving up. */
const CANDIDATES_PER_STEP = 3;

const GROW_OPTION_KEYS = [
  'allowedMaterials',
  'back',
  'layerMaterials',
  'maxLayers',
  'maxTotalThicknessNm',
  'minThicknessNm',
  'maxThicknessNm',
  'needleThicknessNm',
  'positionStepNm',
  'maxSteps',
  'maxIterations',
  'marginPercent',
  'targets',
  'onStep',
  'derivatives',
  'outermostFixed',
  'outermostOnly',
  'nextToSubstrate',
  'growthMerit',
  'needlesPerStep',
];

/** A coating material the engineer allows Grow layers to use. */
export interface AllowedMaterial {
  name: string;
  model: MaterialModel;
}

/** A layer as plain data: material name and physical thickness. */
export interface GrowLayer {
  material: string;
  thicknessNm: number;
}

export interface GrowStep {
  /** 0 for the refined start, then 1, 2, … */
  step: number;
  layerCount: number;
  totalThicknessNm: number;
  /** Mask merit (with targets), percentage points. */
  merit: number;
  pass: boolean;
  /** Worst mask margin, percentage points. */
  worstMargin: number;
  /** The stack of this step, incident side first. */
  layers: GrowLayer[];
  /** Where this step's needle went: material and depth below the front surface, nm. */
  inserted?: { material: string; depthNm: number };
}

export type GrowStop =
  'maskMet' | 'noImprovement' | 'maxLayers' | 'maxTotalThickness' | 'maxSteps' | 'cancelled';

export interface GrowOptions {
  /** Materials a needle may be made of (at least one). */
  allowedMaterials: AllowedMaterial[];
  /** Substrate treatment (default `none`). */
  back?: BackSurface;
  /**
   * Material name of each start layer. By default a start layer takes the name of the allowed
   * material with the same model, else `layers[i]`.
   */
  layerMaterials?: string[];
  /** Most front layers (default 30). */
  maxLayers?: number;
  /** Most total physical thickness, nm (default 5000). */
  maxTotalThicknessNm?: number;
  /** Thinnest layer kept, nm (default 10); also the lower bound of the final refinement. */
  minThicknessNm?: number;
  /** Upper bound per layer, nm (default 1000). */
  maxThicknessNm?: number;
  /** Thickness an inserted needle starts from before refinement, nm (default 1). */
  needleThicknessNm?: number;
  /** Spacing of the candidate positions through each layer, nm (default 2). */
  positionStepNm?: number;
  /** Most insertion steps (default 30). */
  maxSteps?: number;
  /** Most iterations of each refinement (default 100). */
  maxIterations?: number;
  /** Max/min limits are tightened by this much while refining (default 0.001 percentage points). */
  marginPercent?: number;
  targets?: TargetCurve[];
  /** Called with each kept step (step 0 included); return false to stop (cancel). */
  onStep?: (step: GrowStep) => boolean | void;
  /**
   * `analytic` (default, back `none`): the needle function and the refinement's Jacobian from the
   * characteristic-matrix sweeps; `differences`: probing each position with a thin needle and
   * forward-difference Jacobians (always used for back `incoherent`).
   */
  derivatives?: DerivativeMethod;
  /** Keep the start's front layer outermost: no needle or new layer goes in front of it. */
  outermostFixed?: boolean;
  /**
   * Allowed materials (by name) that may only be the outermost layer, e.g. a soft fluoride on
   * top: no needle or new layer of them goes inside the stack.
   */
  outermostOnly?: string[];
  /** The only allowed materials (by name) a new layer next to the substrate may be; any when omitted. */
  nextToSubstrate?: string[];
  /**
   * The merit the structure grows on (default {@link DEFAULT_GROWTH_MERIT}). `mask`: the one-sided
   * mask merit with the target margin, within [min, max]. `smooth`: every mask sample pulls
   * towards the far side of its limit (R → 0 under a maximum, see MaskMeritOptions.smooth) with
   * ≥ 0 bounds, each step's design is then fitted to the one-sided merit, which decides whether the
   * mask is met, and a needle-optimal design is thickened (see the file comment): for wide bands
   * the one-sided growth stalls on.
   */
  growthMerit?: GrowthMerit;
  /**
   * Needles inserted together in one step, at the deepest separate minima of the needle function
   * (default {@link DEFAULT_NEEDLES_PER_STEP}); when they do not lower the merit together, single
   * needles are tried.
   */
  needlesPerStep?: number;
}

export type GrowthMerit = 'smooth' | 'mask';
export const GROWTH_MERITS: readonly GrowthMerit[] = ['smooth', 'mask'];

export interface GrowResult {
  /** Every kept step, the refined start first: the progression of merit against layer count. */
  steps: GrowStep[];
  /** The last step. */
  final: GrowStep;
  /** The last step as a stack (same media as the start). */
  stack: OpticalStack;
  stoppedBy: GrowStop;
  /** The margin growing aimed for, percentage points; absent in older results. */
  targetMarginPercent?: number;
  /**
   * Yield forecast of the result under RESULT_FORECAST's thickness error, added by the compute
   * queue after the optimisation; absent in older results and when the job was cancelled.
   */
  forecast?: ResultForecast | null;
}

interface WorkLayer {
  material: number;
  thicknessNm: number;
}

interface Refined {
  layers: WorkLayer[];
  /** Σr² (with the margin) of the refined layers. */
  sum: number;
  merit: MaskMerit;
}

interface Candidate {
  /** Index of the position on the depth grid (createNeedleGrid's order: front to substrate). */
  point: number;
  layer: number;
  material: number;
  offsetNm: number;
  derivative: number;
}

/**
 * Grows `stack`'s front coating by the needle method until `mask` is met or a limit is reached
 * (see the file comment). Deterministic. Throws {@link OpticsInputError} naming the field for
 * bad input (no allowed material, duplicate names, bounds with min > max, an empty mask, …).
 */
export function growLayers(stack: OpticalStack, mask: SpecMask, options: GrowOptions): GrowResult {
  const settings = growSettings(stack, options);
  const work = startWork(settings, options.layerMaterials);
  const { ctx, targetMarginPercent } = growContext(settings, work, mask, options);
  const {
    steps,
    shown,
    best: found,
    stoppedBy,
  } = runGrowth(ctx, work.layers, settings.maxSteps, targetMarginPercent, options.onStep);
  let best = found;
  // On the mask merit every kept step is better than the one before; on the smooth merit the
  // thickened steps need not be, and the result is the best fitted design.
  if (stoppedBy === 'maskMet' || stoppedBy === 'cancelled' || ctx.final === ctx.base)
    best = { refined: shown, step: steps.length - 1 };
  return {
    steps,
    final: steps[best.step],
    stack: ctx.stackOf(best.refined.layers),
    stoppedBy,
    targetMarginPercent,
  };
}

/** The validated options of one run, with their defaults. */
function growSettings(stack: OpticalStack, options: GrowOptions) {
  const opts = plainObject(options, '');
  onlyKeys(opts, GROW_OPTION_KEYS, '');
  const start = validateOpticalStack(stack);
  const materials = allowedMaterials(opts.allowedMaterials);
  const minNm = nonNegativeOption(opts.minThicknessNm, 'minThicknessNm', DEFAULT_MIN_THICKNESS_NM);
  const maxNm = positiveOption(opts.maxThicknessNm, 'maxThicknessNm', DEFAULT_MAX_THICKNESS_NM);
  layerBounds(1, minNm, maxNm, undefined);
  const maxLayers = wholeNumber(opts.maxLayers, 'maxLayers', 1, 1000, DEFAULT_MAX_LAYERS);
  const maxTotal = positiveOption(
    opts.maxTotalThicknessNm,
    'maxTotalThicknessNm',
    DEFAULT_MAX_TOTAL_THICKNESS_NM,
  );
  const needleNm = nonNegativeOption(opts.needleThicknessNm, 'needleThicknessNm', 1);
  const positionStep = positiveOption(opts.positionStepNm, 'positionStepNm', 2);
  const maxSteps = wholeNumber(opts.maxSteps, 'maxSteps', 0, 1000, DEFAULT_MAX_STEPS);
  const maxIterations = wholeNumber(opts.maxIterations, 'maxIterations', 1, 100_000, DEFAULT_MAX_ITERATIONS);
  const derivatives =
    opts.derivatives === undefined ? 'analytic' : oneOf(opts.derivatives, DERIVATIVE_METHODS, 'derivatives');
  const growthMerit =
    opts.growthMerit === undefined
      ? DEFAULT_GROWTH_MERIT
      : oneOf(opts.growthMerit, GROWTH_MERITS, 'growthMerit');
  const needlesPerStep = wholeNumber(opts.needlesPerStep, 'needlesPerStep', 1, 100, DEFAULT_NEEDLES_PER_STEP);
  if (opts.outermostFixed !== undefined && typeof opts.outermostFixed !== 'boolean') {
    throw new OpticsInputError('outermostFixed', 'must be true or false');
  }
  const outermostFixed = opts.outermostFixed === true && start.layers.length > 0;
  const materialNames = (value: unknown, field: string): string[] | undefined => {
    if (value === undefined) return undefined;
    if (!Array.isArray(value)) throw new OpticsInputError(field, 'must be a list of allowed material names');
    return value.map((name, i) => {
      if (typeof name !== 'string' || !materials.some((m) => m.name === name))
        throw new OpticsInputError(fieldPath(field, i), `"${String(name)}" is not an allowed material`);
      return name;
    });
  };
  const outermostOnly = materialNames(opts.outermostOnly, 'outermostOnly') ?? [];
  const nextToSubstrate = materialNames(opts.nextToSubstrate, 'nextToSubstrate');
  if (opts.onStep !== undefined && typeof opts.onStep !== 'function') {
    throw new OpticsInputError('onStep', 'must be a function');
  }
  if (start.layers.length > maxLayers) {
    throw new OpticsInputError('maxLayers', `is below the start's ${start.layers.length} layers`);
  }

  return {
    start,
    materials,
    minNm,
    maxNm,
    maxLayers,
    maxTotal,
    needleNm,
    positionStep,
    maxSteps,
    maxIterations,
    derivatives,
    growthMerit,
    needlesPerStep,
    outermostFixed,
    outermostOnly,
    nextToSubstrate,
  };
}

type GrowSettings = ReturnType<typeof growSettings>;

/**
 * The start's layers as indices into one list of names and models: the allowed materials first,
 * then start materials not among them.
 */
function startWork(settings: GrowSettings, layerMaterials: string[] | undefined) {
  const { start, materials } = settings;
  const names = materials.map((m) => m.name);
  const models = materials.map((m) => m.model);
  const keys = models.map((m) => JSON.stringify(m));
  const startNames = startLayerNames(start, layerMaterials, names, keys);
  const layers: WorkLayer[] = start.layers.map((layer, i) => {
    const key = JSON.stringify(layer.material);
    let index = names.indexOf(startNames[i]);
    if (index >= 0 && keys[index] !== key) {
      throw new OpticsInputError(
        fieldPath('layerMaterials', i),
        `"${startNames[i]}" already names another material model than that of layers[${i}]`,
      );
    }
    if (index < 0) {
      index = names.length;
      names.push(startNames[i]);
      models.push(layer.material);
      keys.push(key);
    }
    return { material: index, thicknessNm: layer.thicknessNm };
  });
  return { names, models, layers };
}

/** The merits, buffers and limits every step of the run shares. */
function growContext(
  settings: GrowSettings,
  work: ReturnType<typeof startWork>,
  mask: SpecMask,
  options: GrowOptions,
): { ctx: GrowContext; targetMarginPercent: number } {
  const { start, materials, minNm, maxNm, maxLayers, maxTotal, needleNm, positionStep } = settings;
  const { maxIterations, derivatives, growthMerit, needlesPerStep, outermostFixed } = settings;
  const { outermostOnly, nextToSubstrate } = settings;
  const { names, models, layers } = work;
  const allowedCount = materials.length;
  // Quarter-wave thickness of each allowed material at the centre of the mask's wavelengths.
  const grid = maskGrid(mask);
  const centreNm = (grid.wavelengthsNm[0] + grid.wavelengthsNm[grid.wavelengthsNm.length - 1]) / 2;
  const quarterWaveNm = materials.map((m) => centreNm / (4 * indexAt(m.model, centreNm).n));

  const stackOf = (list: readonly WorkLayer[]): OpticalStack => ({
    ...start,
    layers: list.map((l) => ({ material: models[l.material], thicknessNm: l.thicknessNm })),
  });
  const targetMarginPercent = options.marginPercent ?? DEFAULT_MARGIN_PERCENT;
  const final = createMaskMerit(stackOf(layers), mask, {
    back: options.back,
    targets: options.targets,
    marginPercent: targetMarginPercent,
  });
  const base =
    growthMerit === 'smooth'
      ? createMaskMerit(stackOf(layers), mask, { back: options.back, targets: options.targets, smooth: true })
      : final;
  const residual = new Float64Array(base.sampleCount);
  const analytic = derivatives === 'analytic' && base.analyticDerivatives;

  const ctx: GrowContext = {
    base,
    final,
    removalNm: GROWTH_REMOVAL_NM,
    needlesPerStep,
    residual,
    stackOf,
    names,
    allowedCount,
    quarterWaveNm,
    needleMaterials: analytic ? needleMaterialTable(base, materials) : null,
    minNm,
    maxNm,
    maxLayers,
    growingLayers: growthMerit === 'smooth' ? GROWING_LAYERS_FACTOR * maxLayers : maxLayers,
    maxTotal,
    needleNm,
    positionStep,
    maxIterations,
    derivatives,
    outermostFixed,
    placementOk: placementRule(names, outermostOnly, nextToSubstrate, layers),
  };
  return { ctx, targetMarginPercent };
}

/**
 * The steps: refine the start, then insert needles (or whole layers, or thicken) and refine until
 * the mask is met with the target margin or a limit or `onStep` stops it.
 */
function runGrowth(
  ctx: GrowContext,
  layers: WorkLayer[],
  maxSteps: number,
  targetMarginPercent: number,
  onStep: GrowOptions['onStep'],
): { steps: GrowStep[]; shown: Refined; best: { refined: Refined; step: number }; stoppedBy: GrowStop } {
  const { minNm } = ctx;
  const steps: GrowStep[] = [];
  // Growing stops once the mask is met with the target margin, not at the first bare pass. The
  // refinement converges onto the tightened limits from either side, to within its step tolerance;
  // REACHED_TOLERANCE_PERCENT keeps the analytic and the finite-difference Jacobian on one path.
  const reached = (step: GrowStep) => step.worstMargin >= targetMarginPercent - REACHED_TOLERANCE_PERCENT;
  const record = (refined: Refined, inserted?: GrowStep['inserted']): boolean => {
    const step = growStep(ctx, steps.length, refined, inserted);
    steps.push(step);
    return onStep?.(step) !== false;
  };

  let current = refine(ctx, layers, ctx.final === ctx.base ? minNm : 0);
  // The start has at most maxLayers layers, so one of its fitted variants fits the limit.
  let shown = finish(ctx, current) ?? current;
  let best = { refined: shown, step: 0 };
  let thickenings = 0;
  let stoppedBy: GrowStop = 'maxSteps';
  if (!record(shown)) stoppedBy = 'cancelled';
  else if (reached(steps[0])) stoppedBy = 'maskMet';
  else {
    for (let stepNo = 1; stepNo <= maxSteps; stepNo++) {
      if (current.layers.length + 1 > ctx.growingLayers) {
        stoppedBy = 'maxLayers';
        break;
      }
      const reasons = new Set<GrowStop>();
      let next = tryNeedles(ctx, current, reasons) ?? tryWholeLayers(ctx, current, reasons);
      if (!next && ctx.final !== ctx.base && thickenings < MAX_THICKENINGS) {
        next = thicken(ctx, current, reasons);
        thickenings++;
      }
      if (!next) {
        stoppedBy = reasons.has('maxLayers')
          ? 'maxLayers'
          : reasons.has('maxTotalThickness')
            ? 'maxTotalThickness'
            : 'noImprovement';
        break;
      }
      const fitted = finish(ctx, next.refined);
      if (!fitted) {
        stoppedBy = 'maxLayers';
        break;
      }
      current = next.refined;
      shown = fitted;
      if (!record(shown, next.inserted)) {
        stoppedBy = 'cancelled';
        break;
      }
      if (shown.sum < best.refined.sum) {
        best = { refined: shown, step: steps.length - 1 };
        thickenings = 0;
      }
      if (reached(steps[steps.length - 1])) {
        stoppedBy = 'maskMet';
        break;
      }
    }
  }
  return { steps, shown, best, stoppedBy };
}

/** Settings and shared buffers of one Grow layers run. */
interface GrowContext {
  /** The merit growing minimises, of the start; {@link MaskMerit.withStack} gives one per structure. */
  base: MaskMerit;
  /** The one-sided mask merit with the target margin each step is fitted to last (may be `base`). */
  final: MaskMerit;
  /** Layers thinner than this are removed while growing on the smooth merit, nm. */
  removalNm: number;
  needlesPerStep: number;
  residual: Float64Array;
  stackOf: (list: readonly WorkLayer[]) => OpticalStack;
  /** Names of the materials (allowed ones first, then start materials not among them). */
  names: readonly string[];
  allowedCount: number;
  /** Quarter-wave thickness of each allowed material at the mask's centre wavelength, nm. */
  quarterWaveNm: readonly number[];
  /** ε of the allowed materials for the analytic needle function, or null to probe. */
  needleMaterials: NeedleMaterials | null;
  minNm: number;
  maxNm: number;
  maxLayers: number;
  /**
   * Most layers of a structure while growing: maxLayers on the mask merit; on the smooth merit
   * GROWING_LAYERS_FACTOR times that, as thin layers kept while growing go when each step is fitted.
   */
  growingLayers: number;
  maxTotal: number;
  needleNm: number;
  positionStep: number;
  maxIterations: number;
  derivatives: DerivativeMethod;
  outermostFixed: boolean;
  /** Whether a structure keeps the placement rules (outermost-only and next-to-substrate materials). */
  placementOk: (layers: readonly WorkLayer[]) => boolean;
}

/**
 * The placement rules as a check of a structure: an outermost-only material appears only as the
 * front layer, and the layer on the substrate is one of `nextToSubstrate` (when given). A rule the
 * start already breaks is not held against it (the engineer chose that start), only new breaches.
 */
function placementRule(
  names: readonly string[],
  outermostOnly: readonly string[],
  nextToSubstrate: readonly string[] | undefined,
  start: readonly WorkLayer[],
): (layers: readonly WorkLayer[]) => boolean {
  const inner = new Set(outermostOnly.map((n) => names.indexOf(n)));
  const last = nextToSubstrate && new Set(nextToSubstrate.map((n) => names.indexOf(n)));
  const startInner = start.slice(1).filter((l) => inner.has(l.material)).length;
  const startLast = start[start.length - 1]?.material;
  return (layers) => {
    if (inner.size > 0 && layers.slice(1).filter((l) => inner.has(l.material)).length > startInner)
      return false;
    const bottom = layers[layers.length - 1]?.material;
    if (last && bottom !== undefined && bottom !== startLast && !last.has(bottom)) return false;
    return true;
  };
}

/** A kept structure and where its new layer went. */
interface Grown {
  refined: Refined;
  inserted: { material: string; depthNm: number };
}

/** Refines `list` within [lower, maxNm] on a merit for its structure; returns it refined. */
function refine(
  ctx: GrowContext,
  list: readonly WorkLayer[],
  lower: number,
  on: MaskMerit = ctx.base,
): Refined {
  const merit = on.withStack(ctx.stackOf(list));
  const bounds = layerBounds(list.length, lower, ctx.maxNm, undefined);
  const fit = refineThicknesses(
    merit,
    list.map((l) => l.thicknessNm),
    bounds,
    { maxIterations: ctx.maxIterations, derivatives: ctx.derivatives },
  );
  const out = list.map((l, i) => ({ material: l.material, thicknessNm: fit.thicknessesNm[i] }));
  // refineThicknesses leaves the merit's spectrum at its result.
  const sum = merit.residualsOf(ctx.residual, true);
  return { layers: out, sum, merit };
}

/**
 * A grown structure fitted to the one-sided mask merit with the target margin within [min, max]:
 * the design a step reports. The same structure when growing is on that merit already.
 */
function finish(ctx: GrowContext, grown: Refined): Refined | null {
  if (ctx.final === ctx.base) return grown;
  let best: Refined | null = null;
  if (grown.layers.length <= ctx.maxLayers) {
    const raised = grown.layers.map((l) => ({
      material: l.material,
      thicknessNm: Math.max(ctx.minNm, l.thicknessNm),
    }));
    best = refine(ctx, raised, ctx.minNm, ctx.final);
  }
  const kept = withoutThinLayers(ctx, grown.layers, ctx.minNm);
  if (
    kept.length < grown.layers.length &&
    kept.length > 0 &&
    kept.length <= ctx.maxLayers &&
    ctx.placementOk(kept)
  ) {
    const dropped = refine(ctx, kept, ctx.minNm, ctx.final);
    if (!best || dropped.sum < best.sum) best = dropped;
  }
  return best;
}

/**
 * {@link dropThinLayers} at `belowNm`, except that a fixed outermost layer is never removed (it
 * is raised to `belowNm` instead).
 */
function withoutThinLayers(ctx: GrowContext, layers: readonly WorkLayer[], belowNm: number): WorkLayer[] {
  if (!ctx.outermostFixed || layers.length === 0) return dropThinLayers(layers, belowNm);
  const front = { material: layers[0].material, thicknessNm: Math.max(belowNm, layers[0].thicknessNm) };
  const rest = dropThinLayers(layers.slice(1), belowNm);
  return rest[0]?.material === front.material
    ? [{ material: front.material, thicknessNm: front.thicknessNm + rest[0].thicknessNm }, ...rest.slice(1)]
    : [front, ...rest];
}

/** The step record of a refined structure. */
function growStep(
  ctx: GrowContext,
  index: number,
  refined: Refined,
  inserted?: GrowStep['inserted'],
): GrowStep {
  const { layers: list, merit } = refined;
  merit.compute(list.map((l) => l.thicknessNm));
  const worstMargin = merit.worstMarginOf();
  const step: GrowStep = {
    step: index,
    layerCount: list.length,
    totalThicknessNm: list.reduce((t, l) => t + l.thicknessNm, 0),
    merit: merit.meritOf(),
    pass: worstMargin >= 0,
    worstMargin,
    layers: list.map((l) => ({ material: ctx.names[l.material], thicknessNm: l.thicknessNm })),
  };
  if (inserted) step.inserted = inserted;
  return step;
}

/** Whether `result` lowers Σr² of `current` (by more than rounding). */
function better(result: Refined | null, current: Refined): result is Refined {
  return result !== null && result.sum < current.sum * (1 - 1e-9);
}

/**
 * Refines a grown structure within [min, max]; for a needle first with ≥ 0 bounds and its thin
 * layers dropped, or, when dropping undoes the needle, raised to the minimum thickness. Null (and
 * the reason added) when the result is over a limit.
 */
function settle(
  ctx: GrowContext,
  current: Refined,
  grown: WorkLayer[],
  needle: boolean,
  reasons: Set<GrowStop>,
): Refined | null {
  if (grown.length > ctx.growingLayers) {
    reasons.add('maxLayers');
    return null;
  }
  let result: Refined;
  if (ctx.final !== ctx.base) {
    // Growing on the smooth merit: thicknesses ≥ 0, vanishing layers removed; the minimum
    // thickness is the business of finish().
    const free = refine(ctx, grown, 0);
    const kept = withoutThinLayers(ctx, free.layers, ctx.removalNm);
    result = kept.length === free.layers.length ? free : kept.length > 0 ? refine(ctx, kept, 0) : current;
  } else if (needle) {
    const free = refine(ctx, grown, 0).layers;
    const kept = dropThinLayers(free, ctx.minNm);
    result = kept.length > 0 ? refine(ctx, kept, ctx.minNm) : current;
    if (!better(result, current)) {
      const raised = free.map((l) => ({
        material: l.material,
        thicknessNm: Math.max(ctx.minNm, l.thicknessNm),
      }));
      result = refine(ctx, raised, ctx.minNm);
    }
  } else {
    result = refine(ctx, grown, ctx.minNm);
  }
  if (result.layers.length > ctx.growingLayers) {
    reasons.add('maxLayers');
    return null;
  }
  if (result.layers.reduce((t, l) => t + l.thicknessNm, 0) > ctx.maxTotal) {
    reasons.add('maxTotalThickness');
    return null;
  }
  return result;
}

/**
 * Scans the needle function; first inserts needles at its deepest separate minima together (up to
 * needlesPerStep), then tries the CANDIDATES_PER_STEP best distinct (layer, material) positions
 * one by one; the first settled structure that lowers the merit, or null.
 */
function tryNeedles(ctx: GrowContext, current: Refined, reasons: Set<GrowStop>): Grown | null {
  const layers = current.layers;
  const candidates = ctx.needleMaterials
    ? scanNeedlesAnalytic(current.merit, layers, ctx.needleMaterials, ctx.positionStep, ctx.outermostFixed)
    : scanNeedles(
        current.merit,
        layers,
        ctx.allowedCount,
        ctx.stackOf,
        ctx.positionStep,
        ctx.residual,
        ctx.outermostFixed,
      );
  const depthOf = (cand: Candidate) => {
    let depth = cand.offsetNm;
    for (let j = 0; j < cand.layer; j++) depth += layers[j].thicknessNm;
    return depth;
  };
  const allowed = candidates.filter((c) => ctx.placementOk(insertNeedles(layers, [c], ctx.needleNm)));
  const minima = deepestMinima(allowed, ctx.needlesPerStep);
  if (minima.length > 1) {
    const result = settle(ctx, current, insertNeedles(layers, minima, ctx.needleNm), true, reasons);
    if (better(result, current) && ctx.placementOk(result.layers)) {
      return {
        refined: result,
        inserted: { material: ctx.names[minima[0].material], depthNm: depthOf(minima[0]) },
      };
    }
  }
  const tried = new Set<string>();
  for (const cand of allowed) {
    const key = `${cand.layer}:${cand.material}`;
    if (tried.has(key)) continue;
    if (tried.size >= CANDIDATES_PER_STEP) break;
    tried.add(key);
    const result = settle(ctx, current, insertNeedles(layers, [cand], ctx.needleNm), true, reasons);
    if (better(result, current) && ctx.placementOk(result.layers)) {
      return { refined: result, inserted: { material: ctx.names[cand.material], depthNm: depthOf(cand) } };
    }
  }
  return null;
}

/**
 * The deepest local minima of the needle function along depth (the lowest material at each grid
 * point), deepest first: at most `count`, each at least NEEDLE_DEPTH_FRACTION as deep as the
 * deepest. `candidates` are sorted most negative first.
 */
function deepestMinima(candidates: readonly Candidate[], count: number): Candidate[] {
  const best = new Map<number, Candidate>();
  for (const c of candidates) if (!best.has(c.point)) best.set(c.point, c);
  const value = (point: number) => best.get(point)?.derivative ?? 0;
  const out: Candidate[] = [];
  for (const [point, c] of best) {
    if (out.length >= count) break;
    if (out.length > 0 && c.derivative > NEEDLE_DEPTH_FRACTION * out[0].derivative) break;
    if (c.derivative <= value(point - 1) && c.derivative <= value(point + 1)) out.push(c);
  }
  return out;
}

/**
 * When no needle helps on its own: a whole layer of each allowed material at the front or next to
 * the substrate (gradual evolution), from the minimum, a quarter and a half wave; the best refined
 * result that lowers the merit, or null.
 */
function tryWholeLayers(ctx: GrowContext, current: Refined, reasons: Set<GrowStop>): Grown | null {
  const layers = current.layers;
  const total = layers.reduce((t, l) => t + l.thicknessNm, 0);
  let best: Grown | null = null;
  for (const side of ctx.outermostFixed ? (['substrate'] as const) : (['front', 'substrate'] as const)) {
    for (let m = 0; m < ctx.allowedCount; m++) {
      const neighbour = side === 'front' ? layers[0] : layers[layers.length - 1];
      if (neighbour && neighbour.material === m) continue;
      for (const startNm of [ctx.minNm, ctx.quarterWaveNm[m], 2 * ctx.quarterWaveNm[m]]) {
        const layer = { material: m, thicknessNm: startNm };
        const grown = side === 'front' ? [layer, ...layers] : [...layers, layer];
        if (!ctx.placementOk(grown)) continue;
        const result = settle(ctx, current, grown, false, reasons);
        if (
          better(result, current) &&
          ctx.placementOk(result.layers) &&
          (!best || result.sum < best.refined.sum)
        ) {
          best = {
            refined: result,
            inserted: { material: ctx.names[m], depthNm: side === 'front' ? 0 : total },
          };
        }
      }
    }
  }
  return best;
}

/**
 * Gradual evolution once the design is needle-optimal and no whole layer helps: more thickness
 * for the needles to work in. A half-wave layer (at the mask's centre wavelength) of each allowed
 * material next to the substrate, and at the front unless that is fixed, refined; the best is kept
 * even when it does not lower the merit (growth goes on from it). Null when every one is over a
 * limit or breaks a placement rule.
 */
function thicken(ctx: GrowContext, current: Refined, reasons: Set<GrowStop>): Grown | null {
  const layers = current.layers;
  const total = layers.reduce((t, l) => t + l.thicknessNm, 0);
  let best: Grown | null = null;
  for (const side of ctx.outermostFixed ? (['substrate'] as const) : (['front', 'substrate'] as const)) {
    for (let m = 0; m < ctx.allowedCount; m++) {
      const layer = { material: m, thicknessNm: 2 * ctx.quarterWaveNm[m] };
      const grown = side === 'front' ? [layer, ...layers] : [...layers, layer];
      if (!ctx.placementOk(grown)) continue;
      const result = settle(ctx, current, mergeSameMaterial(grown), false, reasons);
      if (result && ctx.placementOk(result.layers) && (!best || result.sum < best.refined.sum)) {
        best = {
          refined: result,
          inserted: { material: ctx.names[m], depthNm: side === 'front' ? 0 : total },
        };
      }
    }
  }
  return best;
}

/**
 * Derivative of Σr² with respect to the thickness of a needle of each allowed material at each
 * candidate position, most negative first (only those that lower the merit).
 */
function scanNeedles(
  merit: MaskMerit,
  layers: readonly WorkLayer[],
  allowedCount: number,
  stackOf: (list: readonly WorkLayer[]) => OpticalStack,
  positionStep: number,
  residual: Float64Array,
  outermostFixed: boolean,
): Candidate[] {
  const L = layers.length;
  const f0 = merit.residuals(
    residual,
    layers.map((l) => l.thicknessNm),
  );
  const out: Candidate[] = [];
  // First grid point of each layer (createNeedleGrid: point 0 is the front surface).
  let first = 1;
  if (L === 0) {
    for (let m = 0; m < allowedCount; m++) {
      const probe = merit.withStack(stackOf([{ material: m, thicknessNm: NEEDLE_PROBE_NM }]));
      const f = probe.residuals(residual, [NEEDLE_PROBE_NM]);
      out.push({ point: 0, layer: 0, material: m, offsetNm: 0, derivative: (f - f0) / NEEDLE_PROBE_NM });
    }
  }
  for (let j = 0; j < L; j++) {
    const host = layers[j];
    const d = host.thicknessNm;
    const count = Math.max(1, Math.ceil(d / positionStep));
    for (let m = 0; m < allowedCount; m++) {
      if (m === host.material) continue;
      const split: WorkLayer[] = [
        ...layers.slice(0, j),
        { material: host.material, thicknessNm: 0 },
        { material: m, thicknessNm: NEEDLE_PROBE_NM },
        { material: host.material, thicknessNm: d },
        ...layers.slice(j + 1),
      ];
      const probe = merit.withStack(stackOf(split));
      const thicknesses = split.map((l) => l.thicknessNm);
      // The interface above layer j is scanned with layer j − 1 (its far end), except the front one.
      for (let k = j === 0 && !outermostFixed ? 0 : 1; k <= count; k++) {
        if (k === count && j < L - 1 && layers[j + 1].material === m) continue;
        if (k === 0 && j > 0 && layers[j - 1].material === m) continue;
        const a = (d * k) / count;
        thicknesses[j] = a;
        // d·k/count can round above d at k = count: keep the rest ≥ 0.
        thicknesses[j + 2] = Math.max(0, d - a);
        const f = probe.residuals(residual, thicknesses);
        const derivative = (f - f0) / NEEDLE_PROBE_NM;
        const point = k === 0 ? 0 : first + k - 1;
        if (derivative < 0) out.push({ point, layer: j, material: m, offsetNm: a, derivative });
      }
    }
    first += count;
  }
  return out.filter((c) => c.derivative < 0).sort((x, y) => x.derivative - y.derivative);
}

/** ε = N² of each allowed material on the merit's wavelengths, for the needle function. */
function needleMaterialTable(merit: MaskMerit, materials: readonly AllowedMaterial[]): NeedleMaterials {
  const wavelengths = merit.plan.wavelengthsNm;
  const nW = wavelengths.length;
  const table = {
    count: materials.length,
    epsRe: new Float64Array(materials.length * nW),
    epsIm: new Float64Array(materials.length * nW),
  };
  const samples = { n: new Float64Array(nW), k: new Float64Array(nW) };
  materials.forEach((m, i) => {
    evaluateIndex(samples, m.model, wavelengths, fieldPath(fieldPath('allowedMaterials', i), 'model'));
    for (let w = 0; w < nW; w++) {
      const n = samples.n[w];
      const k = samples.k[w];
      table.epsRe[i * nW + w] = n * n - k * k;
      table.epsIm[i * nW + w] = 2 * n * k;
    }
  });
  return table;
}

/**
 * The needle scan from the analytic needle function (optics/derivatives.ts): ∂Σr²/∂Δ of a needle
 * of each allowed material at every grid point, in one pass; the candidates that lower the merit,
 * most negative first. Same positions and exclusions as {@link scanNeedles}.
 */
function scanNeedlesAnalytic(
  merit: MaskMerit,
  layers: readonly WorkLayer[],
  materials: NeedleMaterials,
  positionStep: number,
  outermostFixed: boolean,
): Candidate[] {
  const L = layers.length;
  const thicknesses = layers.map((l) => l.thicknessNm);
  merit.compute(thicknesses);
  const size = merit.plan.size;
  const gR = new Float64Array(size);
  const gT = new Float64Array(size);
  merit.gradientWeights(gR, gT);
  const grid = createNeedleGrid(thicknesses, positionStep);
  const values = needleFunction(
    new Float64Array(materials.count * grid.count),
    merit.plan,
    materials,
    grid,
    gR,
    gT,
  );
  const out: Candidate[] = [];
  for (let k = 0; k < grid.count; k++) {
    if (k === 0 && outermostFixed) continue;
    const j = grid.layer[k];
    const offsetNm = grid.offsetNm[k];
    const atBack = k > 0 && k < grid.count && offsetNm >= thicknesses[j];
    for (let m = 0; m < materials.count; m++) {
      if (L > 0 && layers[j].material === m) continue;
      if (atBack && j < L - 1 && layers[j + 1].material === m) continue;
      const derivative = values[m * grid.count + k];
      if (derivative < 0) out.push({ point: k, layer: j, material: m, offsetNm, derivative });
    }
  }
  return out.sort((x, y) => x.derivative - y.derivative);
}

/**
 * The layers with a needle of each candidate's material inserted at its position (zero-thickness
 * parts left out, neighbours of one material merged). Positions must be distinct.
 */
function insertNeedles(
  layers: readonly WorkLayer[],
  cands: readonly Candidate[],
  needleNm: number,
): WorkLayer[] {
  if (layers.length === 0) return [{ material: cands[0].material, thicknessNm: needleNm }];
  const list = layers.map((l) => ({ ...l }));
  // Deepest first, so the layer indices of the shallower ones stay valid.
  const order = [...cands].sort((x, y) => y.layer - x.layer || y.offsetNm - x.offsetNm);
  for (const cand of order) {
    const host = list[cand.layer];
    const above = cand.offsetNm;
    const below = host.thicknessNm - cand.offsetNm;
    const parts: WorkLayer[] = [];
    if (above > 1e-9) parts.push({ material: host.material, thicknessNm: above });
    parts.push({ material: cand.material, thicknessNm: needleNm });
    if (below > 1e-9) parts.push({ material: host.material, thicknessNm: below });
    list.splice(cand.layer, 1, ...parts);
  }
  return mergeSameMaterial(list);
}

/**
 * Removes layers thinner than `minNm`, thinnest first, merging the neighbours that then touch and
 * share a material, until every layer is at least `minNm` thick.
 */
export function dropThinLayers<T extends { material: number | string; thicknessNm: number }>(
  layers: readonly T[],
  minNm: number,
): T[] {
  let list = layers.map((l) => ({ ...l }));
  for (;;) {
    let thinnest = -1;
    for (let i = 0; i < list.length; i++) {
      if (list[i].thicknessNm < minNm && (thinnest < 0 || list[i].thicknessNm < list[thinnest].thicknessNm)) {
        thinnest = i;
      }
    }
    if (thinnest < 0) return list;
    list.splice(thinnest, 1);
    list = mergeSameMaterial(list);
  }
}

function mergeSameMaterial<T extends { material: number | string; thicknessNm: number }>(
  layers: readonly T[],
): T[] {
  const out: T[] = [];
  for (const layer of layers) {
    const last = out[out.length - 1];
    if (last && last.material === layer.material) last.thicknessNm += layer.thicknessNm;
    else out.push({ ...layer });
  }
  return out;
}

function allowedMaterials(input: unknown): AllowedMaterial[] {
  if (!Array.isArray(input) || input.length === 0) {
    throw new OpticsInputError('allowedMaterials', 'must list at least one material ({ name, model })');
  }
  const seen = new Set<string>();
  return input.map((item, i) => {
    const field = fieldPath('allowedMaterials', i);
    const obj = plainObject(item, field);
    if (typeof obj.name !== 'string' || obj.name.trim() === '') {
      throw new OpticsInputError(fieldPath(field, 'name'), 'must be a non-empty name');
    }
    if (seen.has(obj.name)) {
      throw new OpticsInputError(fieldPath(field, 'name'), `"${obj.name}" is listed twice`);
    }
    seen.add(obj.name);
    return { name: obj.name, model: validateMaterialModel(obj.model, fieldPath(field, 'model')) };
  });
}

function startLayerNames(
  start: OpticalStack,
  given: unknown,
  names: readonly string[],
  keys: readonly string[],
): string[] {
  if (given !== undefined) {
    if (!Array.isArray(given) || given.length !== start.layers.length) {
      throw new OpticsInputError('layerMaterials', `must list ${start.layers.length} names, one per layer`);
    }
    return given.map((name, i) => {
      if (typeof name !== 'string' || name.trim() === '') {
        throw new OpticsInputError(fieldPath('layerMaterials', i), 'must be a non-empty name');
      }
      return name;
    });
  }
  return start.layers.map((layer, i) => {
    const found = keys.indexOf(JSON.stringify(layer.material));
    return found >= 0 ? names[found] : `layers[${i}]`;
  });
}
