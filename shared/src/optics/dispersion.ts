/*
 * Dispersion models: the complex index N = n + ik of a material as a function of wavelength.
 * k ≥ 0 is absorption (the sign coating data sheets use). Wavelengths are in nm at this API; the
 * Cauchy and Sellmeier coefficients follow the usual glass-catalogue convention of λ in µm.
 */
import {
  finiteNumber,
  nonNegativeNumber,
  numberList,
  oneOf,
  onlyKeys,
  plainObject,
  positiveNumber,
} from './checks.js';
import { OpticsInputError, fieldPath } from './errors.js';

/** Wavelength-independent index. */
export interface ConstantIndex {
  model: 'constant';
  /** Refractive index, > 0. */
  n: number;
  /** Extinction coefficient, ≥ 0 (0 when omitted). */
  k?: number;
}

/**
 * Exponential absorption tail for the Cauchy model:
 * k(λ) = k · exp(exponent · (1/λ − 1/reference)), λ and reference taken in µm.
 */
export interface CauchyAbsorption {
  /** Extinction coefficient at `reference`, ≥ 0. */
  k: number;
  /** Exponent in µm; > 0 makes k grow towards short wavelengths (an absorption edge in the UV). */
  exponent: number;
  /** Reference wavelength in nm, > 0. */
  reference: number;
}

/**
 * Where a formula model holds: the wavelengths its coefficients were fitted or measured over, in nm.
 * Outside it a formula is refused, or (with `clamp`) evaluated at the nearer end and reported, just
 * as a table is; a formula is never extrapolated silently.
 */
export interface ValidRange {
  from: number;
  to: number;
}

/** Cauchy: n(λ) = A + B/λ² + C/λ⁴ with λ in µm (B in µm², C in µm⁴). */
export interface CauchyModel {
  model: 'cauchy';
  /** Wavelengths (nm) the fit holds for; unbounded when omitted. */
  validNm?: ValidRange;
  /** Outside `validNm`: `false` (default) is an error; `true` holds the end values and reports it. */
  clamp?: boolean;
  A: number;
  B?: number;
  C?: number;
  /** Constant extinction coefficient (use either `k` or `absorption`). */
  k?: number;
  absorption?: CauchyAbsorption;
}

/** Sellmeier: n²(λ) = 1 + Σ Bᵢ λ² / (λ² − Cᵢ), λ in µm, Cᵢ in µm², 1 to 3 terms. */
export interface SellmeierModel {
  model: 'sellmeier';
  /** Wavelengths (nm) the coefficients hold for; unbounded when omitted. */
  validNm?: ValidRange;
  /** Outside `validNm`: `false` (default) is an error; `true` holds the end values and reports it. */
  clamp?: boolean;
  B: readonly number[];
  C: readonly number[];
  /** Constant extinction coefficient, ≥ 0 (0 when omitted). */
  k?: number;
}

/** Tabulated n and k, interpolated between the rows. */
export interface TabulatedIndex {
  model: 'table';
  /** Wavelengths in nm, strictly increasing, at least 2. */
  wavelengths: readonly number[];
  n: readonly number[];
  /** Extinction coefficients (all 0 when omitted). */
  k?: readonly number[];
  /**
   * `linear` (default) or `pchip` — the shape-preserving cubic of F. N. Fritsch and R. E. Carlson,
   * SIAM J. Numer. Anal. 17, 238 (1980), which never overshoots the data (so k stays ≥ 0).
   */
  interpolation?: 'linear' | 'pchip';
  /**
   * Outside the table: `false` (default) is an error; `true` holds the end rows' values and the
   * engine reports how many points it clamped. There is never a silent extrapolation.
   */
  clamp?: boolean;
}

/** Any dispersion model. Plain data, so it survives JSON and structured clone (worker threads). */
export type MaterialModel = ConstantIndex | CauchyModel | SellmeierModel | TabulatedIndex;

/** Output buffers of {@link evaluateIndex}. */
export interface IndexSamples {
  n: Float64Array;
  k: Float64Array;
}

const MODELS = ['constant', 'cauchy', 'sellmeier', 'table'] as const;

/**
 * Checks a dispersion model and returns a normalised copy (defaults filled in: k = 0, B = C = 0,
 * linear interpolation, no clamp). Throws {@link OpticsInputError} naming the field under `field`.
 */
export function validateMaterialModel(value: unknown, field = ''): MaterialModel {
  const obj = plainObject(value, field);
  const model = oneOf(obj.model, MODELS, fieldPath(field, 'model'));
  const at = (key: string) => fieldPath(field, key);
  switch (model) {
    case 'constant': {
      onlyKeys(obj, ['model', 'n', 'k'], field);
      return { model, n: positiveNumber(obj.n, at('n')), k: optionalK(obj.k, at('k')) };
    }
    case 'cauchy': {
      onlyKeys(obj, ['model', 'A', 'B', 'C', 'k', 'absorption', 'validNm', 'clamp'], field);
      const out: CauchyModel = {
        model,
        ...formulaRange(obj, field),
        A: positiveNumber(obj.A, at('A')),
        B: obj.B === undefined ? 0 : finiteNumber(obj.B, at('B')),
        C: obj.C === undefined ? 0 : finiteNumber(obj.C, at('C')),
      };
      if (obj.absorption !== undefined) {
        if (obj.k !== undefined) {
          throw new OpticsInputError(at('k'), 'give either a constant k or an absorption tail, not both');
        }
        const abs = plainObject(obj.absorption, at('absorption'));
        const absAt = (key: string) => fieldPath(at('absorption'), key);
        onlyKeys(abs, ['k', 'exponent', 'reference'], at('absorption'));
        out.absorption = {
          k: nonNegativeNumber(abs.k, absAt('k')),
          exponent: finiteNumber(abs.exponent, absAt('exponent')),
          reference: positiveNumber(abs.reference, absAt('reference')),
        };
      } else {
        out.k = optionalK(obj.k, at('k'));
      }
      return out;
    }
    case 'sellmeier': {
      onlyKeys(obj, ['model', 'B', 'C', 'k', 'validNm', 'clamp'], field);
      const B = numberList(obj.B, at('B'));
      const C = numberList(obj.C, at('C'), nonNegativeNumber);
      if (B.length < 1 || B.length > 3) {
        throw new OpticsInputError(at('B'), `must have 1 to 3 terms (got ${B.length})`);
      }
      if (C.length !== B.length) {
        throw new OpticsInputError(at('C'), `must have as many terms as B (${B.length}, got ${C.length})`);
      }
      return { model, ...formulaRange(obj, field), B, C, k: optionalK(obj.k, at('k')) };
    }
    case 'table': {
      onlyKeys(obj, ['model', 'wavelengths', 'n', 'k', 'interpolation', 'clamp'], field);
      const wavelengths = numberList(obj.wavelengths, at('wavelengths'), positiveNumber);
      if (wavelengths.length < 2) {
        throw new OpticsInputError(at('wavelengths'), `needs at least 2 rows (got ${wavelengths.length})`);
      }
      for (let i = 1; i < wavelengths.length; i++) {
        if (!(wavelengths[i] > wavelengths[i - 1])) {
          throw new OpticsInputError(
            fieldPath(at('wavelengths'), i),
            `wavelengths must increase strictly (${wavelengths[i]} nm follows ${wavelengths[i - 1]} nm)`,
          );
        }
      }
      const n = numberList(obj.n, at('n'), positiveNumber);
      if (n.length !== wavelengths.length) {
        throw new OpticsInputError(
          at('n'),
          `must have one value per wavelength (${wavelengths.length}, got ${n.length})`,
        );
      }
      const k =
        obj.k === undefined ? wavelengths.map(() => 0) : numberList(obj.k, at('k'), nonNegativeNumber);
      if (k.length !== wavelengths.length) {
        throw new OpticsInputError(
          at('k'),
          `must have one value per wavelength (${wavelengths.length}, got ${k.length})`,
        );
      }
      const interpolation =
        obj.interpolation === undefined
          ? 'linear'
          : oneOf(obj.interpolation, ['linear', 'pchip'] as const, at('interpolation'));
      return { model, wavelengths, n, k, interpolation, clamp: clampFlag(obj.clamp, at('clamp')) };
    }
  }
}

function clampFlag(value: unknown, field: string): boolean {
  if (value !== undefined && typeof value !== 'boolean') {
    throw new OpticsInputError(field, 'must be true or false');
  }
  return value === true;
}

/** A formula's optional `validNm` and `clamp`, checked (0 < from < to). */
function formulaRange(
  obj: Record<string, unknown>,
  field: string,
): { validNm?: ValidRange; clamp?: boolean } {
  const at = fieldPath(field, 'validNm');
  const clamp = clampFlag(obj.clamp, fieldPath(field, 'clamp'));
  if (obj.validNm === undefined) {
    if (clamp) throw new OpticsInputError(fieldPath(field, 'clamp'), 'needs a validNm range to hold');
    return {};
  }
  const range = plainObject(obj.validNm, at);
  onlyKeys(range, ['from', 'to'], at);
  const from = positiveNumber(range.from, fieldPath(at, 'from'));
  const to = positiveNumber(range.to, fieldPath(at, 'to'));
  if (!(to > from)) {
    throw new OpticsInputError(at, `from (${from} nm) must be below to (${to} nm)`);
  }
  return { validNm: { from, to }, clamp };
}

function optionalK(value: unknown, field: string): number {
  return value === undefined ? 0 : nonNegativeNumber(value, field);
}

/** Shorthand for a constant index, N = n + ik. */
export function constantIndex(n: number, k = 0): ConstantIndex {
  return { model: 'constant', n, k };
}

/**
 * Evaluates a (validated) dispersion model at each wavelength.
 *
 * @param out receives n[i] and k[i] at wavelengthsNm[i]; both arrays at least as long as the grid.
 * @param wavelengthsNm wavelengths in nm, each > 0.
 * @param field path used in error messages (e.g. `layers[2]`).
 * @returns out.
 * @throws OpticsInputError when a wavelength is outside a table or a formula's `validNm` without
 *   `clamp`, or when the model
 *   gives no physical index there (Sellmeier pole, n ≤ 0, non-finite values).
 */
export function evaluateIndex(
  out: IndexSamples,
  model: MaterialModel,
  wavelengthsNm: ArrayLike<number>,
  field = '',
): IndexSamples {
  const count = wavelengthsNm.length;
  if (out.n.length < count || out.k.length < count) {
    throw new OpticsInputError(field, `output buffers hold fewer than ${count} wavelengths`);
  }
  const { n, k } = out;
  switch (model.model) {
    case 'constant':
      n.fill(model.n, 0, count);
      k.fill(model.k ?? 0, 0, count);
      break;
    case 'cauchy': {
      const A = model.A;
      const B = model.B ?? 0;
      const C = model.C ?? 0;
      const abs = model.absorption;
      for (let i = 0; i < count; i++) {
        const nm = formulaWavelength(model, wavelengthsNm[i], field);
        const um2 = (nm * 1e-3) ** 2;
        n[i] = A + B / um2 + C / (um2 * um2);
        k[i] = abs ? abs.k * Math.exp(abs.exponent * (1e3 / nm - 1e3 / abs.reference)) : (model.k ?? 0);
      }
      break;
    }
    case 'sellmeier': {
      const terms = model.B.length;
      for (let i = 0; i < count; i++) {
        const um2 = (formulaWavelength(model, wavelengthsNm[i], field) * 1e-3) ** 2;
        let n2 = 1;
        for (let j = 0; j < terms; j++) n2 += (model.B[j] * um2) / (um2 - model.C[j]);
        n[i] = Math.sqrt(n2);
        k[i] = model.k ?? 0;
      }
      break;
    }
    case 'table':
      evaluateTable(out, model, wavelengthsNm, field);
      break;
  }
  for (let i = 0; i < count; i++) {
    if (!(n[i] > 0 && Number.isFinite(n[i]) && k[i] >= 0 && Number.isFinite(k[i]))) {
      throw new OpticsInputError(
        field,
        `the ${model.model} model gives no physical index at ${wavelengthsNm[i]} nm ` +
          `(n = ${n[i]}, k = ${k[i]}; n must be > 0 and k ≥ 0)`,
      );
    }
  }
  return out;
}

/** n and k at one wavelength (nm). Convenience for UI code; allocates. */
export function indexAt(model: MaterialModel, wavelengthNm: number, field = ''): { n: number; k: number } {
  const out = { n: new Float64Array(1), k: new Float64Array(1) };
  evaluateIndex(out, model, [wavelengthNm], field);
  return { n: out.n[0], k: out.k[0] };
}

/**
 * The wavelengths (nm) a model holds for: a table's first and last rows, a formula's `validNm`;
 * `null` for a constant or a formula without a stated range.
 */
export function modelRangeNm(model: MaterialModel): ValidRange | null {
  switch (model.model) {
    case 'table':
      return { from: model.wavelengths[0], to: model.wavelengths[model.wavelengths.length - 1] };
    case 'cauchy':
    case 'sellmeier':
      return model.validNm ?? null;
    case 'constant':
      return null;
  }
}

/**
 * How many of the wavelengths lie outside a model's range ({@link modelRangeNm}); 0 for a model
 * without one. With `clamp` these are the points evaluated at the held end values.
 */
export function countOutsideRange(model: MaterialModel, wavelengthsNm: ArrayLike<number>): number {
  const range = modelRangeNm(model);
  if (!range) return 0;
  const lo = range.from;
  const hi = range.to;
  let outside = 0;
  for (let i = 0; i < wavelengthsNm.length; i++) {
    if (wavelengthsNm[i] < lo || wavelengthsNm[i] > hi) outside++;
  }
  return outside;
}

/**
 * The wavelength (nm) a formula is evaluated at: λ itself inside `validNm`, the nearer end with
 * `clamp`; outside without `clamp` it throws (entry-point check, before any kernel runs).
 */
function formulaWavelength(model: CauchyModel | SellmeierModel, nm: number, field: string): number {
  const range = model.validNm;
  if (!range || (nm >= range.from && nm <= range.to)) return nm;
  if (!model.clamp) {
    throw new OpticsInputError(
      fieldPath(field, 'validNm'),
      `${nm} nm is outside the ${model.model} model's valid range (${range.from}–${range.to} nm); ` +
        'choose a material that covers it or set "clamp": true to hold the end values',
    );
  }
  return nm < range.from ? range.from : range.to;
}

function evaluateTable(
  out: IndexSamples,
  model: TabulatedIndex,
  wavelengthsNm: ArrayLike<number>,
  field: string,
): void {
  const xs = model.wavelengths;
  const last = xs.length - 1;
  const ks = model.k ?? xs.map(() => 0);
  const pchip = model.interpolation === 'pchip';
  const dn = pchip ? pchipSlopes(xs, model.n) : null;
  const dk = pchip ? pchipSlopes(xs, ks) : null;
  for (let i = 0; i < wavelengthsNm.length; i++) {
    let x = wavelengthsNm[i];
    if (x < xs[0] || x > xs[last]) {
      if (!model.clamp) {
        throw new OpticsInputError(
          fieldPath(field, 'wavelengths'),
          `${x} nm is outside the table (${xs[0]}–${xs[last]} nm); extend the table or set "clamp": true ` +
            'to hold the end values',
        );
      }
      x = x < xs[0] ? xs[0] : xs[last];
    }
    // Binary search for the interval xs[j] ≤ x ≤ xs[j + 1].
    let lo = 0;
    let hi = last;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (xs[mid] <= x) lo = mid;
      else hi = mid;
    }
    const h = xs[hi] - xs[lo];
    const s = (x - xs[lo]) / h;
    if (dn && dk) {
      out.n[i] = hermite(model.n[lo], model.n[hi], dn[lo] * h, dn[hi] * h, s);
      out.k[i] = hermite(ks[lo], ks[hi], dk[lo] * h, dk[hi] * h, s);
    } else {
      out.n[i] = model.n[lo] + s * (model.n[hi] - model.n[lo]);
      out.k[i] = ks[lo] + s * (ks[hi] - ks[lo]);
    }
  }
}

/** Cubic Hermite on [0, 1] with end values y0, y1 and end slopes m0, m1 (per unit s). */
function hermite(y0: number, y1: number, m0: number, m1: number, s: number): number {
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * y0 + (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * y1 + (s3 - s2) * m1;
}

/**
 * Node slopes of the Fritsch–Carlson monotone cubic (interior: weighted harmonic mean of the
 * neighbouring secants, zero at local extrema; ends: shape-preserving three-point formula).
 */
function pchipSlopes(xs: readonly number[], ys: readonly number[]): Float64Array {
  const m = xs.length;
  const d = new Float64Array(m);
  const h = new Float64Array(m - 1);
  const delta = new Float64Array(m - 1);
  for (let i = 0; i < m - 1; i++) {
    h[i] = xs[i + 1] - xs[i];
    delta[i] = (ys[i + 1] - ys[i]) / h[i];
  }
  if (m === 2) {
    d[0] = d[1] = delta[0];
    return d;
  }
  for (let i = 1; i < m - 1; i++) {
    if (delta[i - 1] * delta[i] <= 0) {
      d[i] = 0;
    } else {
      const w1 = 2 * h[i] + h[i - 1];
      const w2 = h[i] + 2 * h[i - 1];
      d[i] = (w1 + w2) / (w1 / delta[i - 1] + w2 / delta[i]);
    }
  }
  d[0] = pchipEnd(h[0], h[1], delta[0], delta[1]);
  d[m - 1] = pchipEnd(h[m - 2], h[m - 3], delta[m - 2], delta[m - 3]);
  return d;
}

function pchipEnd(h0: number, h1: number, del0: number, del1: number): number {
  let d = ((2 * h0 + h1) * del0 - h0 * del1) / (h0 + h1);
  if (Math.sign(d) !== Math.sign(del0)) d = 0;
  else if (Math.sign(del0) !== Math.sign(del1) && Math.abs(d) > Math.abs(3 * del0)) d = 3 * del0;
  return d;
}
