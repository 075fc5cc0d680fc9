/*
 * Grid API: R, T, A (and optionally r, t) over wavelengths × angles × polarisations, written into
 * preallocated Float64Arrays. A plan validates the stack and grid once, evaluates every material's
 * dispersion on the grid and holds all scratch memory, so computeSpectrum allocates nothing and can
 * run again and again (e.g. inside an optimiser that only changes thicknesses).
 */
import { incidenceAngle, oneOf, positiveNumber } from './checks.js';
import {
  countOutsideRange,
  evaluateIndex,
  modelRangeNm,
  validateMaterialModel,
  type IndexSamples,
  type MaterialModel,
} from './dispersion.js';
import { OpticsInputError, fieldPath } from './errors.js';
import {
  POL_BOTH,
  POL_P,
  POL_S,
  RESPONSE_STRIDE,
  RESP_A,
  RESP_R,
  RESP_R_IM,
  RESP_R_RE,
  RESP_T,
  RESP_T_IM,
  RESP_T_RE,
  coherentResponse,
  type CoherentMedia,
  type LayerSpan,
} from './matrix.js';
import { validateOpticalStack, type Layer, type OpticalStack } from './stack.js';
import { combineIncoherent, substratePassTransmittance } from './substrate.js';

/** s, p, or the average of s and p (unpolarised light). */
export type Polarisation = 's' | 'p' | 'avg';
export const POLARISATIONS: readonly Polarisation[] = ['s', 'p', 'avg'];

/**
 * How the substrate is treated. `none`: semi-infinite substrate, the front surface alone.
 * `incoherent`: a thick substrate with its back surface (bare or coated), as a spectrophotometer
 * measures the part.
 */
export type BackSurface = 'none' | 'incoherent';
export const BACK_SURFACES: readonly BackSurface[] = ['none', 'incoherent'];

/** The grid to compute on. */
export interface SpectralGrid {
  /** Wavelengths in nm, each > 0 (any order). */
  wavelengthsNm: ArrayLike<number>;
  /** Angles of incidence in degrees, 0 ≤ θ < 90, in the incident medium. */
  anglesDeg: ArrayLike<number>;
  /** Polarisations, each listed once. */
  polarisations: readonly Polarisation[];
}

export interface SpectrumOptions {
  /** Substrate treatment; `none` when omitted. */
  back?: BackSurface;
  /** Also compute the complex amplitudes r and t (coherent `none` only, s and p only). */
  amplitudes?: boolean;
}

/**
 * Results, each indexed by {@link spectrumIndex}: `(iPol·nAngles + iAngle)·nWavelengths + iWl`, so
 * one spectrum (all wavelengths at one angle and polarisation) is contiguous.
 */
export interface SpectrumOutput {
  /** Reflectance, fraction 0–1. */
  R: Float64Array;
  /** Transmittance into the exit medium (`incoherent`) or into the substrate (`none`), fraction. */
  T: Float64Array;
  /** Absorptance 1 − R − T, fraction. */
  A: Float64Array;
  /** Complex reflection coefficient, interleaved [re, im] (twice the length), or null. */
  r: Float64Array | null;
  /** Complex transmission coefficient (tangential E), interleaved [re, im], or null. */
  t: Float64Array | null;
}

/** A validated stack and grid with dispersion evaluated and scratch memory held. */
export interface SpectrumPlan {
  readonly stack: OpticalStack;
  readonly wavelengthsNm: Float64Array;
  readonly anglesDeg: Float64Array;
  readonly polarisations: readonly Polarisation[];
  readonly back: BackSurface;
  readonly amplitudes: boolean;
  /** Number of (wavelength, angle, polarisation) points: the length of R, T and A. */
  readonly size: number;
  /** Flagged approximations, e.g. table values held constant outside their range. */
  readonly warnings: readonly string[];
  /** @internal evaluated inputs and scratch */
  readonly work: PlanWork;
}

/** @internal Per-plan arrays used by computeSpectrum. */
export interface PlanWork {
  layerCount: number;
  backLayerCount: number;
  /** ε = N² of front layers, [iWl·layerCount + l]. */
  frontEpsRe: Float64Array;
  frontEpsIm: Float64Array;
  frontThicknessNm: Float64Array;
  backEpsRe: Float64Array;
  backEpsIm: Float64Array;
  backThicknessNm: Float64Array;
  incN: Float64Array;
  subEpsRe: Float64Array;
  subEpsIm: Float64Array;
  exitEpsRe: Float64Array;
  exitEpsIm: Float64Array;
  k0: Float64Array;
  sinAngles: Float64Array;
  polMask: number;
  substrateThicknessNm: number;
  front: Float64Array;
  frontBack: Float64Array;
  backSurface: Float64Array;
  /** Layer spans of the front coating (both ways) and the back coating; offsets move per wavelength. */
  frontSpan: LayerSpan;
  frontReversedSpan: LayerSpan;
  backSpan: LayerSpan;
  /** Light and media of the kernel call being made. */
  media: CoherentMedia;
  /** Materials checked and evaluated on this grid, shared with plans made from this one. */
  materials: MaterialCache;
}

/**
 * @internal A checked material and its index on a plan's wavelengths, kept for the material object
 * it came from. `data` is a copy of that object's content when it was checked: an entry serves only
 * while the object still holds the same data, so a material edited in place is checked and
 * evaluated again.
 */
interface MaterialEntry {
  data: unknown;
  model: MaterialModel;
  samples: IndexSamples;
  /** Wavelengths outside the model's range (held at its end values). */
  outside: number;
}

/** @internal Material entries keyed by the caller's material object (identity). */
type MaterialCache = WeakMap<object, MaterialEntry>;

/**
 * Validates `stack`, `grid` and `options` once and prepares everything computeSpectrum needs.
 * Throws {@link OpticsInputError} naming the field (bad grid values, a wavelength outside a table
 * or a formula's valid range without clamp, an absorbing incident medium, a missing substrate thickness for an absorbing
 * substrate under `incoherent`, amplitudes asked for where they are not defined).
 */
export function createSpectrumPlan(
  stack: OpticalStack,
  grid: SpectralGrid,
  options: SpectrumOptions = {},
): SpectrumPlan {
  const wavelengthsNm = toFloat64(grid.wavelengthsNm, 'wavelengthsNm', positiveNumber);
  const anglesDeg = toFloat64(grid.anglesDeg, 'anglesDeg', incidenceAngle);
  const polarisations = checkPolarisations(grid.polarisations);
  const back = options.back === undefined ? 'none' : oneOf(options.back, BACK_SURFACES, 'back');
  const amplitudes = options.amplitudes === true;
  if (amplitudes && back !== 'none') {
    throw new OpticsInputError(
      'amplitudes',
      'complex r and t exist only for the coherent front surface (back "none")',
    );
  }
  if (amplitudes && polarisations.includes('avg')) {
    throw new OpticsInputError(
      'amplitudes',
      'complex r and t are defined for s and p, not for their average',
    );
  }
  return buildPlan(stack, wavelengthsNm, anglesDeg, polarisations, back, amplitudes, new WeakMap());
}

/**
 * A plan for `stack` on the grid and options of `previous` (e.g. the same mask for a structure
 * with a layer inserted). Materials `previous` or a plan it was made from has seen (the same
 * object with the same data) are neither checked nor evaluated again; the result is the same as
 * createSpectrumPlan's for that stack, warnings included. Throws as createSpectrumPlan.
 */
export function createSpectrumPlanFor(stack: OpticalStack, previous: SpectrumPlan): SpectrumPlan {
  return buildPlan(
    stack,
    previous.wavelengthsNm,
    previous.anglesDeg,
    previous.polarisations,
    previous.back,
    previous.amplitudes,
    previous.work.materials,
  );
}

/** The plan from a checked grid and options; `materials` is read and extended. */
function buildPlan(
  stack: OpticalStack,
  wavelengthsNm: Float64Array,
  anglesDeg: Float64Array,
  polarisations: readonly Polarisation[],
  back: BackSurface,
  amplitudes: boolean,
  materials: MaterialCache,
): SpectrumPlan {
  // Models checked in this call, by the object they came from (one object may fill many layers).
  const seen = new Map<object, MaterialEntry>();
  const entryOf = new Map<MaterialModel, MaterialEntry>();
  const checkMaterial = (value: unknown, field: string): MaterialModel => {
    if (value === null || typeof value !== 'object') return validateMaterialModel(value, field);
    // An object met earlier in this stack is the entry made or checked then (once per call).
    const met = seen.get(value);
    if (met) return met.model;
    const known = materials.get(value);
    if (known && sameData(value, known.data)) {
      seen.set(value, known);
      entryOf.set(known.model, known);
      return known.model;
    }
    const model = validateMaterialModel(value, field);
    const entry: MaterialEntry = {
      data: copyData(value),
      model,
      samples: { n: EMPTY, k: EMPTY },
      outside: 0,
    };
    seen.set(value, entry);
    entryOf.set(model, entry);
    return model;
  };
  const checked = validateOpticalStack(stack, checkMaterial);

  const nW = wavelengthsNm.length;
  const warnings: string[] = [];
  const evalMedium = (model: MaterialModel, field: string): IndexSamples => {
    const entry = entryOf.get(model);
    let samples: IndexSamples;
    let outside: number;
    if (entry && entry.samples.n.length === nW) {
      samples = entry.samples;
      outside = entry.outside;
    } else {
      samples = { n: new Float64Array(nW), k: new Float64Array(nW) };
      evaluateIndex(samples, model, wavelengthsNm, field);
      outside = countOutsideRange(model, wavelengthsNm);
      if (entry) {
        entry.samples = samples;
        entry.outside = outside;
      }
    }
    const range = modelRangeNm(model);
    if (outside > 0 && range) {
      const what = model.model === 'table' ? 'table covers' : `${model.model} model holds for`;
      warnings.push(
        `${field}: ${what} ${range.from}–${range.to} nm; its end values were held at ${outside} of ${nW} wavelengths`,
      );
    }
    return samples;
  };
  const toEps = (samples: IndexSamples, re: Float64Array, im: Float64Array, stride: number, at: number) => {
    for (let i = 0; i < nW; i++) {
      const n = samples.n[i];
      const k = samples.k[i];
      re[i * stride + at] = n * n - k * k;
      im[i * stride + at] = 2 * n * k;
    }
  };
  const layerArrays = (layers: readonly Layer[], field: string) => {
    const count = layers.length;
    const re = new Float64Array(nW * count);
    const im = new Float64Array(nW * count);
    const thickness = new Float64Array(count);
    layers.forEach((layer, l) => {
      toEps(evalMedium(layer.material, fieldPath(field, l)), re, im, count, l);
      thickness[l] = layer.thicknessNm;
    });
    return { count, re, im, thickness };
  };

  const incident = evalMedium(checked.incident, 'incident');
  for (let i = 0; i < nW; i++) {
    if (incident.k[i] !== 0) {
      throw new OpticsInputError(
        'incident',
        `the incident medium must be lossless, but k = ${incident.k[i]} at ${wavelengthsNm[i]} nm`,
      );
    }
  }
  const front = layerArrays(checked.layers, 'layers');
  const substrate = evalMedium(checked.substrate, 'substrate');
  const subEpsRe = new Float64Array(nW);
  const subEpsIm = new Float64Array(nW);
  toEps(substrate, subEpsRe, subEpsIm, 1, 0);

  let backLayers = {
    count: 0,
    re: new Float64Array(0),
    im: new Float64Array(0),
    thickness: new Float64Array(0),
  };
  const exitEpsRe = new Float64Array(nW);
  const exitEpsIm = new Float64Array(nW);
  let substrateThicknessNm = 0;
  if (back === 'incoherent') {
    backLayers = layerArrays(checked.backLayers, 'back_layers');
    toEps(evalMedium(checked.exit, 'exit'), exitEpsRe, exitEpsIm, 1, 0);
    const lossyAt = substrate.k.findIndex((k) => k > 0);
    if (checked.substrateThicknessMm !== undefined) {
      substrateThicknessNm = checked.substrateThicknessMm * 1e6;
    } else if (lossyAt >= 0) {
      throw new OpticsInputError(
        'substrate.thickness_mm',
        `is required for the thick-substrate (incoherent) model because the substrate absorbs ` +
          `(k = ${substrate.k[lossyAt]} at ${wavelengthsNm[lossyAt]} nm)`,
      );
    }
  }

  // Only materials that evaluated without error on this grid are kept for later plans.
  for (const [value, entry] of seen) materials.set(value, entry);

  const k0 = new Float64Array(nW);
  for (let i = 0; i < nW; i++) k0[i] = (2 * Math.PI) / wavelengthsNm[i];
  const sinAngles = new Float64Array(anglesDeg.length);
  for (let a = 0; a < anglesDeg.length; a++) sinAngles[a] = Math.sin((anglesDeg[a] * Math.PI) / 180);
  const wantS = polarisations.some((p) => p !== 'p');
  const wantP = polarisations.some((p) => p !== 's');
  const polMask = wantS && wantP ? POL_BOTH : wantS ? POL_S : POL_P;

  return {
    stack: checked,
    wavelengthsNm,
    anglesDeg,
    polarisations,
    back,
    amplitudes,
    size: nW * anglesDeg.length * polarisations.length,
    warnings,
    work: {
      layerCount: front.count,
      backLayerCount: backLayers.count,
      frontEpsRe: front.re,
      frontEpsIm: front.im,
      frontThicknessNm: front.thickness,
      backEpsRe: backLayers.re,
      backEpsIm: backLayers.im,
      backThicknessNm: backLayers.thickness,
      incN: incident.n,
      subEpsRe,
      subEpsIm,
      exitEpsRe,
      exitEpsIm,
      k0,
      sinAngles,
      polMask,
      substrateThicknessNm,
      front: new Float64Array(2 * RESPONSE_STRIDE),
      frontBack: new Float64Array(2 * RESPONSE_STRIDE),
      backSurface: new Float64Array(2 * RESPONSE_STRIDE),
      frontSpan: span(front, false),
      frontReversedSpan: span(front, true),
      backSpan: span(backLayers, false),
      media: { k0: 0, beta: 0, incRe: 0, incIm: 0, exitRe: 0, exitIm: 0, polMask },
      materials,
    },
  };
}

/** Marks a material entry not yet evaluated on the grid. */
const EMPTY = new Float64Array(0);

/** Whether two pieces of plain data (numbers, strings, booleans, arrays, plain objects) are equal. */
function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') return false;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) {
      const x: unknown = a[i];
      const y: unknown = b[i];
      if (x !== y && !sameData(x, y)) return false;
    }
    return true;
  }
  if (Array.isArray(b)) return false;
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  for (const key of ka) {
    if (!Object.hasOwn(b, key)) return false;
    if (!sameData((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key])) return false;
  }
  return true;
}

/** A deep copy of plain data, to compare a material object against later ({@link sameData}). */
function copyData(value: unknown): unknown {
  if (value === null || typeof value !== 'object') return value;
  if (Array.isArray(value)) return value.map(copyData);
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(value)) out[key] = copyData((value as Record<string, unknown>)[key]);
  return out;
}

function span(
  layers: { count: number; re: Float64Array; im: Float64Array; thickness: Float64Array },
  reversed: boolean,
): LayerSpan {
  return {
    epsRe: layers.re,
    epsIm: layers.im,
    epsOffset: 0,
    thicknessNm: layers.thickness,
    thicknessOffset: 0,
    layerCount: layers.count,
    reversed,
  };
}

/** Allocates output arrays sized for `plan` (r and t only when the plan computes amplitudes). */
export function createSpectrumOutput(plan: SpectrumPlan): SpectrumOutput {
  return {
    R: new Float64Array(plan.size),
    T: new Float64Array(plan.size),
    A: new Float64Array(plan.size),
    r: plan.amplitudes ? new Float64Array(2 * plan.size) : null,
    t: plan.amplitudes ? new Float64Array(2 * plan.size) : null,
  };
}

/** Position of (polarisation, angle, wavelength) in the arrays of a {@link SpectrumOutput}. */
export function spectrumIndex(plan: SpectrumPlan, iPol: number, iAngle: number, iWavelength: number): number {
  return (iPol * plan.anglesDeg.length + iAngle) * plan.wavelengthsNm.length + iWavelength;
}

/**
 * Replaces the front layers' physical thicknesses (nm) of a plan in place, e.g. between optimiser
 * steps; dispersion stays evaluated. Throws for a wrong count or a negative/non-finite value.
 */
export function setLayerThicknesses(plan: SpectrumPlan, thicknessesNm: ArrayLike<number>): void {
  const target = plan.work.frontThicknessNm;
  if (thicknessesNm.length !== target.length) {
    throw new OpticsInputError(
      'thicknessesNm',
      `needs ${target.length} values (got ${thicknessesNm.length})`,
    );
  }
  for (let i = 0; i < target.length; i++) {
    const d = thicknessesNm[i];
    if (!(Number.isFinite(d) && d >= 0)) {
      throw new OpticsInputError(fieldPath('thicknessesNm', i), `must be a finite number ≥ 0 (got ${d})`);
    }
  }
  for (let i = 0; i < target.length; i++) target[i] = thicknessesNm[i];
}

/**
 * Computes the plan's grid into `out` (sized by {@link createSpectrumOutput}).
 *
 * `out.R/T/A[i]` receive fractions at {@link spectrumIndex}; with amplitudes, `out.r/t[2i]` and
 * `[2i + 1]` the real and imaginary parts. Characteristic-matrix method (Macleod, ch. 2), incoherent
 * substrate per substrate.ts. Allocates nothing.
 */
export function computeSpectrum(out: SpectrumOutput, plan: SpectrumPlan): SpectrumOutput {
  if (out.R.length < plan.size || out.T.length < plan.size || out.A.length < plan.size) {
    throw new OpticsInputError('out', `output arrays must hold ${plan.size} values`);
  }
  if (plan.amplitudes && (!out.r || !out.t || out.r.length < 2 * plan.size || out.t.length < 2 * plan.size)) {
    throw new OpticsInputError('out', `r and t must hold ${2 * plan.size} values (re, im interleaved)`);
  }
  const w = plan.work;
  const nW = plan.wavelengthsNm.length;
  const nA = plan.anglesDeg.length;
  const pols = plan.polarisations;
  const nP = pols.length;
  const incoherent = plan.back === 'incoherent';
  const L = w.layerCount;
  const Lb = w.backLayerCount;
  const F = w.front;
  const FB = w.frontBack;
  const BK = w.backSurface;
  const { R, T, A, r, t } = out;

  const { frontSpan, frontReversedSpan, backSpan, media } = w;
  for (let iw = 0; iw < nW; iw++) {
    const k0 = w.k0[iw];
    const n0 = w.incN[iw];
    const eps0 = n0 * n0;
    const sRe = w.subEpsRe[iw];
    const sIm = w.subEpsIm[iw];
    frontSpan.epsOffset = iw * L;
    frontReversedSpan.epsOffset = iw * L;
    backSpan.epsOffset = iw * Lb;
    for (let ia = 0; ia < nA; ia++) {
      const beta = n0 * w.sinAngles[ia];
      media.k0 = k0;
      media.beta = beta;
      media.incRe = eps0;
      media.incIm = 0;
      media.exitRe = sRe;
      media.exitIm = sIm;
      coherentResponse(F, frontSpan, media);
      if (incoherent) {
        media.incRe = sRe;
        media.incIm = sIm;
        media.exitRe = eps0;
        media.exitIm = 0;
        coherentResponse(FB, frontReversedSpan, media);
        media.exitRe = w.exitEpsRe[iw];
        media.exitIm = w.exitEpsIm[iw];
        coherentResponse(BK, backSpan, media);
        const tau = substratePassTransmittance(k0, beta, sRe, sIm, w.substrateThicknessNm);
        // The part's R, T, A replace the front surface's in F (same positions), per polarisation.
        for (let o = 0; o <= RESPONSE_STRIDE; o += RESPONSE_STRIDE) {
          combineIncoherent(
            F,
            o,
            F[o + RESP_R],
            F[o + RESP_T],
            FB[o + RESP_R],
            FB[o + RESP_T],
            BK[o + RESP_R],
            BK[o + RESP_T],
            tau,
          );
        }
      }
      for (let ip = 0; ip < nP; ip++) {
        const idx = (ip * nA + ia) * nW + iw;
        const pol = pols[ip];
        if (pol === 'avg') {
          R[idx] = 0.5 * (F[RESP_R] + F[RESPONSE_STRIDE + RESP_R]);
          T[idx] = 0.5 * (F[RESP_T] + F[RESPONSE_STRIDE + RESP_T]);
          A[idx] = 0.5 * (F[RESP_A] + F[RESPONSE_STRIDE + RESP_A]);
        } else {
          const o = pol === 's' ? 0 : RESPONSE_STRIDE;
          R[idx] = F[o + RESP_R];
          T[idx] = F[o + RESP_T];
          A[idx] = F[o + RESP_A];
          if (r && t) {
            r[2 * idx] = F[o + RESP_R_RE];
            r[2 * idx + 1] = F[o + RESP_R_IM];
            t[2 * idx] = F[o + RESP_T_RE];
            t[2 * idx + 1] = F[o + RESP_T_IM];
          }
        }
      }
    }
  }
  return out;
}

/** Rounds a wavelength to 1e-6 nm, the resolution at which grid points are taken as equal. */
export function roundWavelengthNm(x: number): number {
  return Math.round(x * 1e6) / 1e6;
}

/** Most points one evenly spaced wavelength range may hold (guards against a mistyped step). */
export const MAX_RANGE_POINTS = 1_000_000;

/**
 * Evenly spaced wavelengths fromNm, fromNm + stepNm, … up to toNm, with toNm itself always included
 * (values rounded to 1e-6 nm so ranges that meet share their grid points). Throws
 * {@link OpticsInputError} for from > to, a step ≤ 0, non-finite values or more than
 * {@link MAX_RANGE_POINTS} points; `fields` names the three inputs in messages.
 */
export function evenWavelengthsNm(
  fromNm: number,
  toNm: number,
  stepNm: number,
  fields: [from: string, to: string, step: string] = ['fromNm', 'toNm', 'stepNm'],
): number[] {
  const from = positiveNumber(fromNm, fields[0]);
  const to = positiveNumber(toNm, fields[1]);
  const step = positiveNumber(stepNm, fields[2]);
  if (from > to)
    throw new OpticsInputError(fields[0], `must not exceed ${fields[1]} (${from} nm > ${to} nm)`);
  if ((to - from) / step > MAX_RANGE_POINTS) {
    throw new OpticsInputError(
      fields[2],
      `gives more than ${MAX_RANGE_POINTS} wavelengths between ${from} and ${to} nm`,
    );
  }
  const count = Math.floor((to - from) / step + 1e-9);
  const out: number[] = [];
  for (let i = 0; i <= count; i++) out.push(roundWavelengthNm(from + i * step));
  if (out[out.length - 1] < to - 1e-9) out.push(roundWavelengthNm(to));
  return out;
}

/** Plan, output and compute in one call, for one-off use. */
export function calculateSpectrum(
  stack: OpticalStack,
  grid: SpectralGrid,
  options: SpectrumOptions = {},
): SpectrumOutput & { plan: SpectrumPlan } {
  const plan = createSpectrumPlan(stack, grid, options);
  return { ...computeSpectrum(createSpectrumOutput(plan), plan), plan };
}

/** One point of a spectrum. */
export interface PointResponse {
  R: number;
  T: number;
  A: number;
  /** Complex r and t as [re, im]; only for `back: 'none'` and s or p. */
  r?: [number, number];
  t?: [number, number];
}

/** R, T, A (and r, t where defined) at one wavelength (nm), angle (degrees) and polarisation. */
export function responseAt(
  stack: OpticalStack,
  wavelengthNm: number,
  angleDeg: number,
  polarisation: Polarisation,
  options: Omit<SpectrumOptions, 'amplitudes'> = {},
): PointResponse {
  const amplitudes = (options.back ?? 'none') === 'none' && polarisation !== 'avg';
  const res = calculateSpectrum(
    stack,
    { wavelengthsNm: [wavelengthNm], anglesDeg: [angleDeg], polarisations: [polarisation] },
    { ...options, amplitudes },
  );
  const point: PointResponse = { R: res.R[0], T: res.T[0], A: res.A[0] };
  if (res.r && res.t) {
    point.r = [res.r[0], res.r[1]];
    point.t = [res.t[0], res.t[1]];
  }
  return point;
}

function toFloat64(
  values: ArrayLike<number>,
  field: string,
  check: (value: unknown, field: string) => number,
): Float64Array {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new OpticsInputError(field, 'must be a list of numbers');
  }
  if (values.length === 0) throw new OpticsInputError(field, 'must not be empty');
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = check(values[i], fieldPath(field, i));
  return out;
}

function checkPolarisations(values: readonly Polarisation[]): Polarisation[] {
  if (!Array.isArray(values) || values.length === 0) {
    throw new OpticsInputError('polarisations', 'must list at least one of "s", "p", "avg"');
  }
  const seen = new Set<Polarisation>();
  return values.map((value, i) => {
    const pol = oneOf(value, POLARISATIONS, fieldPath('polarisations', i));
    if (seen.has(pol)) throw new OpticsInputError(fieldPath('polarisations', i), `"${pol}" is listed twice`);
    seen.add(pol);
    return pol;
  });
}
