/*
 * Yield forecast: Monte Carlo over deposition errors. Each trial perturbs every front layer's
 * thickness (relative and/or absolute, normal or uniform), optionally every material's index and a
 * systematic thickness error shared by all layers of one material (rate calibration), computes the
 * spectrum on the mask's grid and checks the mask. Seeded and reproducible.
 *
 * Error model of trial i, layer l of material m (z are deviates of the chosen distribution:
 * standard normal, or uniform on (−1, 1); a percentage is 1σ for normal and the half-width for
 * uniform):
 *   d_l = max(0, d⁰_l·(1 + s_m + ρ·z_l) + α·z′_l),   s_m = σ_sys,m·z″_m,
 *   n_l(λ) = n⁰_l(λ)·(1 + σ_idx,m·z‴_m)   (k unchanged),
 * with ρ, α the relative and absolute thickness errors. Trial i draws its deviates from position
 * i·K of one seeded mulberry32 stream (K fixed by the layer and material counts), so any split of
 * the trials into parts gives the same numbers per trial, and merging parts gives the same result.
 *
 * Sensitivity ranking: for the first `sensitivityTrials` trials each layer is also run alone with
 * its own thickness error of that trial (random and systematic share; every other layer nominal,
 * indices nominal). Layer l's yield loss is the fraction of those single-layer runs that fail the
 * mask; its margin loss is the nominal worst margin minus their mean worst margin. Layers are
 * ranked by yield loss, then margin loss: the layers the operators must hold tight come first.
 *
 * Percentile envelopes come from the first `envelopeTrials` trials (all values are kept for
 * those), percentiles by linear interpolation between order statistics (Hyndman & Fan type 7).
 */
import { evaluateIndex } from '../optics/dispersion.js';
import { plainObject, onlyKeys, numberList, finiteNumber, oneOf } from '../optics/checks.js';
import { OpticsInputError, fieldPath } from '../optics/errors.js';
import { validateSpecMask, type MaskQuantity, type SpecMask } from '../optics/mask.js';
import { validateOpticalStack, type OpticalStack } from '../optics/stack.js';
import { BACK_SURFACES, type BackSurface, type Polarisation } from '../optics/batch.js';
import { createMaskMerit, type MaskMerit } from './merit.js';
import { nonNegativeOption, wholeNumber } from './options.js';
import { Mulberry32, drawsFor, fillDeviates } from './random.js';

/** How a thickness error is drawn: normal (the value is 1σ) or uniform (the value is the half-width). */
export const ERROR_DISTRIBUTIONS = ['normal', 'uniform'] as const;
export type ErrorDistribution = (typeof ERROR_DISTRIBUTIONS)[number];

/** Most trials of one forecast. */
export const MAX_TRIALS = 100_000;
/** Trials of a forecast when none is asked for. */
export const DEFAULT_TRIALS = 2000;
/** Seed of a forecast when none is given: the same request gives the same forecast. */
export const DEFAULT_SEED = 1;
/** Largest seed: the generator's state is one unsigned 32-bit word. */
export const MAX_SEED = 0xffffffff;
/** Most kept envelope values (envelope trials × envelope points). */
export const MAX_ENVELOPE_VALUES = 20_000_000;
/** Bins of the worst-margin histogram. */
const HISTOGRAM_BINS = 30;
/** Trials per progress report of {@link forecastYield}. */
const PROGRESS_CHUNK = 250;

export interface ThicknessErrors {
  /** Relative error per layer, percent (1σ or half-width). Default 0. */
  relativePercent?: number;
  /** Absolute error per layer, nm (1σ or half-width). Default 0. */
  absoluteNm?: number;
  /** Distribution of every error of the forecast (default `normal`). */
  distribution?: ErrorDistribution;
}

/** A per-material relative error, percent (1σ or half-width). */
export interface MaterialError {
  relativePercent: number;
}

export interface YieldOptions {
  /** Number of trials, 1–100 000 (default 2000). */
  trials?: number;
  /** Seed, a whole number 0 … 2³² − 1 (default 1). */
  seed?: number;
  thickness?: ThicknessErrors;
  /** Index error per material name: all layers of the material share it within a trial. */
  indexErrors?: Record<string, MaterialError>;
  /** Systematic thickness error per material name (rate calibration), shared within a trial. */
  systematic?: Record<string, MaterialError>;
  /** Material name of each front layer (needed for indexErrors and systematic). */
  layerMaterials?: string[];
  /** Envelope and worst-margin percentiles, each 0–100 (default [5, 50, 95]). */
  percentiles?: number[];
  /** Trials whose spectra make the envelope (default min(trials, 2000)). */
  envelopeTrials?: number;
  /** Trials used for the per-layer sensitivity (default min(trials, 1000); 0 skips it). */
  sensitivityTrials?: number;
  /** Substrate treatment (default `none`). */
  back?: BackSurface;
  /** Called with the fraction done every few hundred trials; return false to stop (cancel). */
  onProgress?: (fraction: number) => boolean | void;
}

/** Validated, plain-data description of a forecast: what a worker thread needs to run trials. */
export interface YieldJob {
  stack: OpticalStack;
  mask: SpecMask;
  back: BackSurface;
  trials: number;
  seed: number;
  distribution: ErrorDistribution;
  relativePercent: number;
  absoluteNm: number;
  /** Material name of each front layer. */
  layerMaterials: string[];
  /** Distinct material names in order of first use, and their errors (percent). */
  materials: string[];
  indexPercent: number[];
  systematicPercent: number[];
  percentiles: number[];
  envelopeTrials: number;
  sensitivityTrials: number;
}

/**
 * Results of trials [from, to) of a job. Arrays are Float64Arrays (transfer their buffers between
 * threads); {@link mergeYieldParts} also takes plain number arrays.
 */
export interface YieldPart {
  from: number;
  to: number;
  passed: number;
  /** Worst mask margin of each trial, percentage points. */
  worstMargins: ArrayLike<number>;
  /** For trials below envelopeTrials: each envelope point's value (percent), trial after trial. */
  envelopeValues: ArrayLike<number>;
  /** For trials below sensitivityTrials: worst margin with one layer perturbed, layer after layer. */
  sensitivityMargins: ArrayLike<number>;
}

export interface PercentileValue {
  p: number;
  value: number;
}

export interface YieldEnvelope {
  quantity: MaskQuantity;
  angleDeg: number;
  polarisation: Polarisation;
  wavelengthsNm: number[];
  /** The nominal design's values, percent. */
  nominal: number[];
  /** Per percentile, values at each wavelength, percent. */
  percentiles: { p: number; values: number[] }[];
}

export interface LayerSensitivity {
  /** Front-layer index (0 = incident side). */
  layer: number;
  material: string;
  /** Fraction of single-layer runs that fail the mask. */
  yieldLossFraction: number;
  /** Nominal worst margin minus the mean worst margin of the single-layer runs, percentage points. */
  marginLossPercent: number;
}

export interface YieldForecast {
  /** Trials run (fewer than requested when cancelled). */
  trials: number;
  requestedTrials: number;
  seed: number;
  passed: number;
  yieldFraction: number;
  stoppedBy: 'completed' | 'cancelled';
  nominal: { pass: boolean; worstMargin: number };
  /** Distribution of the trials' worst margins, percentage points. */
  worstMargins: {
    mean: number;
    min: number;
    max: number;
    percentiles: PercentileValue[];
    histogram: { edges: number[]; counts: number[] };
  };
  /** One envelope per (quantity, angle, polarisation) the mask names. */
  envelopes: YieldEnvelope[];
  envelopeTrials: number;
  /** Layers, most yield-costly first. */
  sensitivity: LayerSensitivity[];
  sensitivityTrials: number;
}

/** Runs trials of one job; keeps its plan and buffers between calls. */
export interface YieldRunner {
  run(from: number, to: number): YieldPart;
}

interface EnvelopeCurve {
  quantity: MaskQuantity;
  angleDeg: number;
  polarisation: Polarisation;
  /** Offset of the curve's first wavelength in the spectrum arrays. */
  offset: number;
}

/**
 * Validates a forecast's inputs and returns the plain-data job. Throws {@link OpticsInputError}
 * naming the field: trials outside 1–100 000, a negative error, an unknown material name, a stack
 * without layers, an empty mask, …
 */
export function prepareYield(stack: OpticalStack, mask: SpecMask, options: YieldOptions = {}): YieldJob {
  const opts = plainObject(options, '');
  onlyKeys(
    opts,
    [
      'trials',
      'seed',
      'thickness',
      'indexErrors',
      'systematic',
      'layerMaterials',
      'percentiles',
      'envelopeTrials',
      'sensitivityTrials',
      'back',
      'onProgress',
    ],
    '',
  );
  const checkedStack = validateOpticalStack(stack);
  const L = checkedStack.layers.length;
  if (L === 0) throw new OpticsInputError('layers', 'the stack has no layers to perturb');
  const checkedMask = validateSpecMask(mask);
  const trials = wholeNumber(opts.trials, 'trials', 1, MAX_TRIALS, DEFAULT_TRIALS);
  const seed = wholeNumber(opts.seed, 'seed', 0, MAX_SEED, DEFAULT_SEED);
  const back = opts.back === undefined ? 'none' : oneOf(opts.back, BACK_SURFACES, 'back');

  const thickness = opts.thickness === undefined ? {} : plainObject(opts.thickness, 'thickness');
  onlyKeys(thickness, ['relativePercent', 'absoluteNm', 'distribution'], 'thickness');
  const relativePercent = nonNegativeOption(thickness.relativePercent, 'thickness.relativePercent', 0);
  const absoluteNm = nonNegativeOption(thickness.absoluteNm, 'thickness.absoluteNm', 0);
  const distribution =
    thickness.distribution === undefined
      ? 'normal'
      : oneOf(thickness.distribution, ERROR_DISTRIBUTIONS, 'thickness.distribution');

  const byMaterial = opts.indexErrors !== undefined || opts.systematic !== undefined;
  let layerMaterials: string[];
  if (opts.layerMaterials !== undefined) {
    if (!Array.isArray(opts.layerMaterials) || opts.layerMaterials.length !== L) {
      throw new OpticsInputError('layerMaterials', `must list ${L} material names, one per layer`);
    }
    layerMaterials = opts.layerMaterials.map((name, i) => {
      if (typeof name !== 'string' || name.trim() === '') {
        throw new OpticsInputError(fieldPath('layerMaterials', i), 'must be a non-empty name');
      }
      return name;
    });
  } else if (byMaterial) {
    throw new OpticsInputError(
      'layerMaterials',
      'is required with indexErrors or systematic: give the material name of each layer',
    );
  } else {
    // Without names, layers of one dispersion model are one material.
    const keys = checkedStack.layers.map((l) => JSON.stringify(l.material));
    layerMaterials = keys.map((key) => `layers[${keys.indexOf(key)}]`);
  }
  const materials = [...new Set(layerMaterials)];
  const perMaterial = (input: unknown, field: string): number[] => {
    const out = materials.map(() => 0);
    if (input === undefined) return out;
    const obj = plainObject(input, field);
    for (const [name, value] of Object.entries(obj)) {
      const at = fieldPath(field, name);
      const index = materials.indexOf(name);
      if (index < 0) {
        throw new OpticsInputError(
          at,
          `no layer is of material "${name}" (layers use: ${materials.join(', ')})`,
        );
      }
      const entry = plainObject(value, at);
      onlyKeys(entry, ['relativePercent'], at);
      const pct = finiteNumber(entry.relativePercent, fieldPath(at, 'relativePercent'));
      if (pct < 0)
        throw new OpticsInputError(fieldPath(at, 'relativePercent'), `must be 0 or more (got ${pct})`);
      out[index] = pct;
    }
    return out;
  };
  const indexPercent = perMaterial(opts.indexErrors, 'indexErrors');
  const systematicPercent = perMaterial(opts.systematic, 'systematic');

  const percentiles =
    opts.percentiles === undefined
      ? [5, 50, 95]
      : numberList(opts.percentiles, 'percentiles', (v, f) => {
          const x = finiteNumber(v, f);
          if (x < 0 || x > 100) throw new OpticsInputError(f, `must lie between 0 and 100 (got ${x})`);
          return x;
        });
  if (percentiles.length === 0)
    throw new OpticsInputError('percentiles', 'must list at least one percentile');
  const envelopeTrials = wholeNumber(
    opts.envelopeTrials,
    'envelopeTrials',
    0,
    trials,
    Math.min(trials, 2000),
  );
  const sensitivityTrials = wholeNumber(
    opts.sensitivityTrials,
    'sensitivityTrials',
    0,
    trials,
    Math.min(trials, 1000),
  );
  if (opts.onProgress !== undefined && typeof opts.onProgress !== 'function') {
    throw new OpticsInputError('onProgress', 'must be a function');
  }
  const job: YieldJob = {
    stack: checkedStack,
    mask: checkedMask,
    back,
    trials,
    seed,
    distribution,
    relativePercent,
    absoluteNm,
    layerMaterials,
    materials,
    indexPercent,
    systematicPercent,
    percentiles,
    envelopeTrials,
    sensitivityTrials,
  };
  const points = envelopeCurves(createMaskMerit(checkedStack, checkedMask, { back })).length;
  const values = envelopeTrials * points;
  if (values > MAX_ENVELOPE_VALUES) {
    throw new OpticsInputError(
      'envelopeTrials',
      `keeps ${values} values (${envelopeTrials} trials × ${points} points); the most is ${MAX_ENVELOPE_VALUES}`,
    );
  }
  return job;
}

/**
 * Prepares the plan, buffers and nominal indices of a job (from {@link prepareYield}) so that
 * `run(from, to)` computes trials [from, to) with nothing allocated per trial except the part's
 * own arrays.
 */
export function createYieldRunner(job: YieldJob): YieldRunner {
  const merit = createMaskMerit(job.stack, job.mask, { back: job.back });
  const plan = merit.plan;
  const L = plan.work.layerCount;
  const M = job.materials.length;
  const nW = plan.wavelengthsNm.length;
  const nominal = Float64Array.from(plan.stack.layers, (l) => l.thicknessNm);
  const materialOf = Int32Array.from(job.layerMaterials, (name) => job.materials.indexOf(name));
  const rho = job.relativePercent / 100;
  const alpha = job.absoluteNm;
  const sigmaIndex = Float64Array.from(job.indexPercent, (p) => p / 100);
  const sigmaSys = Float64Array.from(job.systematicPercent, (p) => p / 100);
  const indexErrors = sigmaIndex.some((s) => s > 0);

  // Nominal n and k of each layer on the grid, [iWl·L + l], for rewriting ε when indices vary.
  const nomN = new Float64Array(nW * L);
  const nomK = new Float64Array(nW * L);
  if (indexErrors) {
    const samples = { n: new Float64Array(nW), k: new Float64Array(nW) };
    plan.stack.layers.forEach((layer, l) => {
      evaluateIndex(samples, layer.material, plan.wavelengthsNm, fieldPath('layers', l));
      for (let i = 0; i < nW; i++) {
        nomN[i * L + l] = samples.n[i];
        nomK[i * L + l] = samples.k[i];
      }
    });
  }
  const scale = new Float64Array(L);
  const setIndexScale = (): void => {
    // Package-internal: the plan's permittivities are rewritten in place (dispersion stays evaluated).
    const re = plan.work.frontEpsRe;
    const im = plan.work.frontEpsIm;
    for (let i = 0; i < nW; i++) {
      for (let l = 0; l < L; l++) {
        const n = nomN[i * L + l] * scale[l];
        const k = nomK[i * L + l];
        re[i * L + l] = n * n - k * k;
        im[i * L + l] = 2 * n * k;
      }
    }
  };

  const curves = envelopeCurves(merit);
  const P = curves.length * nW;
  const deviateCount = 2 * L + 2 * M;
  const drawsPerTrial = drawsFor(deviateCount);
  const z = new Float64Array(drawsPerTrial);
  const random = new Mulberry32(job.seed);
  const perturbed = new Float64Array(L);
  const single = new Float64Array(L);

  return {
    run(from: number, to: number): YieldPart {
      if (!(Number.isInteger(from) && Number.isInteger(to) && from >= 0 && from <= to && to <= job.trials)) {
        throw new OpticsInputError('from', `trials [${from}, ${to}) must lie within [0, ${job.trials}]`);
      }
      const worstMargins = new Float64Array(to - from);
      const envelopeEnd = Math.max(from, Math.min(to, job.envelopeTrials));
      const envelopeValues = new Float64Array((envelopeEnd - from) * P);
      const sensitivityEnd = Math.max(from, Math.min(to, job.sensitivityTrials));
      const sensitivityMargins = new Float64Array((sensitivityEnd - from) * L);
      let passed = 0;
      for (let trial = from; trial < to; trial++) {
        random.seek(trial * drawsPerTrial);
        fillDeviates(z, deviateCount, random, job.distribution);
        for (let l = 0; l < L; l++) {
          const m = materialOf[l];
          const d = nominal[l] * (1 + sigmaSys[m] * z[2 * L + M + m] + rho * z[l]) + alpha * z[L + l];
          perturbed[l] = d > 0 ? d : 0;
        }
        if (indexErrors) {
          for (let l = 0; l < L; l++) scale[l] = 1 + sigmaIndex[materialOf[l]] * z[2 * L + materialOf[l]];
          setIndexScale();
        }
        const spectrum = merit.compute(perturbed);
        const worst = merit.worstMarginOf();
        worstMargins[trial - from] = worst;
        if (worst >= 0) passed++;
        if (trial < envelopeEnd) {
          let o = (trial - from) * P;
          for (const curve of curves) {
            const values = curve.quantity === 'T' ? spectrum.T : spectrum.R;
            for (let i = 0; i < nW; i++) envelopeValues[o++] = 100 * values[curve.offset + i];
          }
        }
        if (trial < sensitivityEnd) {
          if (indexErrors) {
            scale.fill(1);
            setIndexScale();
          }
          single.set(nominal);
          for (let l = 0; l < L; l++) {
            single[l] = perturbed[l];
            merit.compute(single);
            sensitivityMargins[(trial - from) * L + l] = merit.worstMarginOf();
            single[l] = nominal[l];
          }
        }
      }
      return { from, to, passed, worstMargins, envelopeValues, sensitivityMargins };
    },
  };
}

/** Runs trials [from, to) of `job` (see {@link createYieldRunner}). */
export function runYieldTrials(job: YieldJob, from: number, to: number): YieldPart {
  return createYieldRunner(job).run(from, to);
}

/**
 * Combines parts of one job into the forecast. The parts must cover trials 0 … n without gaps or
 * overlaps (any order); n < job.trials marks a cancelled forecast. The result is the same however
 * the trials were split.
 */
export function mergeYieldParts(job: YieldJob, parts: readonly YieldPart[]): YieldForecast {
  const sorted = [...parts].sort((a, b) => a.from - b.from);
  let next = 0;
  for (const part of sorted) {
    if (part.from !== next || part.to < part.from) {
      throw new OpticsInputError(
        'parts',
        `must cover trials from 0 without gaps or overlaps (expected a part from ${next}, got [${part.from}, ${part.to}))`,
      );
    }
    next = part.to;
  }
  const trials = next;
  if (trials > job.trials)
    throw new OpticsInputError('parts', `cover ${trials} trials, more than the job's ${job.trials}`);

  const merit = createMaskMerit(job.stack, job.mask, { back: job.back });
  const L = merit.layerCount;
  const nW = merit.plan.wavelengthsNm.length;
  const curves = envelopeCurves(merit);
  const P = curves.length * nW;
  const nominalSpectrum = merit.compute(job.stack.layers.map((l) => l.thicknessNm));
  const nominalWorst = merit.worstMarginOf();

  const margins = new Float64Array(trials);
  let passed = 0;
  for (const part of sorted) {
    passed += part.passed;
    for (let i = 0; i < part.to - part.from; i++) margins[part.from + i] = part.worstMargins[i];
  }
  const envelopeTrials = Math.min(trials, job.envelopeTrials);
  const envelope = new Float64Array(envelopeTrials * P);
  const sensitivityTrials = Math.min(trials, job.sensitivityTrials);
  const sensitivity = new Float64Array(sensitivityTrials * L);
  for (const part of sorted) {
    const e = Math.max(0, Math.min(part.to, envelopeTrials) - part.from);
    for (let i = 0; i < e * P; i++) envelope[part.from * P + i] = part.envelopeValues[i];
    const s = Math.max(0, Math.min(part.to, sensitivityTrials) - part.from);
    for (let i = 0; i < s * L; i++) sensitivity[part.from * L + i] = part.sensitivityMargins[i];
  }

  const sortedMargins = Float64Array.from(margins).sort();
  let sum = 0;
  for (let i = 0; i < trials; i++) sum += margins[i];
  const envelopes: YieldEnvelope[] = curves.map((curve, c) => {
    const column = new Float64Array(envelopeTrials);
    const values = job.percentiles.map(() => new Array<number>(nW));
    for (let i = 0; i < nW; i++) {
      for (let t = 0; t < envelopeTrials; t++) column[t] = envelope[t * P + c * nW + i];
      column.sort();
      job.percentiles.forEach((p, j) => (values[j][i] = percentileOfSorted(column, p)));
    }
    const nominalValues = curve.quantity === 'T' ? nominalSpectrum.T : nominalSpectrum.R;
    return {
      quantity: curve.quantity,
      angleDeg: curve.angleDeg,
      polarisation: curve.polarisation,
      wavelengthsNm: Array.from(merit.plan.wavelengthsNm),
      nominal: Array.from({ length: nW }, (_, i) => 100 * nominalValues[curve.offset + i]),
      percentiles: job.percentiles.map((p, j) => ({ p, values: values[j] })),
    };
  });

  const layers: LayerSensitivity[] = [];
  if (sensitivityTrials > 0) {
    for (let l = 0; l < L; l++) {
      let fails = 0;
      let total = 0;
      for (let t = 0; t < sensitivityTrials; t++) {
        const m = sensitivity[t * L + l];
        if (!(m >= 0)) fails++;
        total += m;
      }
      layers.push({
        layer: l,
        material: job.layerMaterials[l],
        yieldLossFraction: fails / sensitivityTrials,
        marginLossPercent: nominalWorst - total / sensitivityTrials,
      });
    }
    layers.sort(
      (a, b) =>
        b.yieldLossFraction - a.yieldLossFraction ||
        b.marginLossPercent - a.marginLossPercent ||
        a.layer - b.layer,
    );
  }

  return {
    trials,
    requestedTrials: job.trials,
    seed: job.seed,
    passed,
    yieldFraction: trials > 0 ? passed / trials : 0,
    stoppedBy: trials < job.trials ? 'cancelled' : 'completed',
    nominal: { pass: nominalWorst >= 0, worstMargin: nominalWorst },
    worstMargins: {
      mean: trials > 0 ? sum / trials : NaN,
      min: trials > 0 ? sortedMargins[0] : NaN,
      max: trials > 0 ? sortedMargins[trials - 1] : NaN,
      percentiles: job.percentiles.map((p) => ({ p, value: percentileOfSorted(sortedMargins, p) })),
      histogram: histogram(sortedMargins),
    },
    envelopes,
    envelopeTrials,
    sensitivity: layers,
    sensitivityTrials,
  };
}

/**
 * Yield forecast in this thread (see the file comment). For every core, use
 * `forecastYieldParallel` from `@quietglass/shared/node/yield-parallel`, which gives the same result.
 */
export function forecastYield(
  stack: OpticalStack,
  mask: SpecMask,
  options: YieldOptions = {},
): YieldForecast {
  const job = prepareYield(stack, mask, options);
  const runner = createYieldRunner(job);
  const parts: YieldPart[] = [];
  for (let from = 0; from < job.trials; from += PROGRESS_CHUNK) {
    const to = Math.min(job.trials, from + PROGRESS_CHUNK);
    parts.push(runner.run(from, to));
    if (options.onProgress?.(to / job.trials) === false) break;
  }
  return mergeYieldParts(job, parts);
}

/**
 * The p-th percentile (0–100) of ascending `sorted` by linear interpolation between order
 * statistics: h = (n − 1)·p/100, x⌊h⌋ + (h − ⌊h⌋)(x⌊h⌋₊₁ − x⌊h⌋) (R. J. Hyndman, Y. Fan, Am. Stat.
 * 50, 361 (1996), type 7). NaN for an empty list.
 */
export function percentileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = ((n - 1) * p) / 100;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

function histogram(sorted: Float64Array): { edges: number[]; counts: number[] } {
  const n = sorted.length;
  if (n === 0) return { edges: [], counts: [] };
  const min = sorted[0];
  const max = sorted[n - 1];
  if (!(max > min)) return { edges: [min, max], counts: [n] };
  const width = (max - min) / HISTOGRAM_BINS;
  const edges = Array.from({ length: HISTOGRAM_BINS + 1 }, (_, i) =>
    i === HISTOGRAM_BINS ? max : min + i * width,
  );
  const counts = new Array<number>(HISTOGRAM_BINS).fill(0);
  for (let i = 0; i < n; i++) counts[Math.min(HISTOGRAM_BINS - 1, Math.floor((sorted[i] - min) / width))]++;
  return { edges, counts };
}

/** The (quantity, angle, polarisation) curves the mask names, with their offsets in the spectrum. */
function envelopeCurves(merit: MaskMerit): EnvelopeCurve[] {
  const plan = merit.plan;
  const nW = plan.wavelengthsNm.length;
  const nA = plan.anglesDeg.length;
  const seen = new Set<string>();
  const out: EnvelopeCurve[] = [];
  for (const band of merit.mask.bands) {
    const pol = band.polarisation ?? 'avg';
    for (const angle of band.angles_deg ?? [0]) {
      const key = `${band.quantity}|${angle}|${pol}`;
      if (seen.has(key)) continue;
      seen.add(key);
      const ia = Array.from(plan.anglesDeg).indexOf(angle);
      out.push({
        quantity: band.quantity,
        angleDeg: angle,
        polarisation: pol,
        offset: (merit.polarisationIndex(pol) * nA + ia) * nW,
      });
    }
  }
  return out;
}
