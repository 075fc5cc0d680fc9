/*
 * Colour of a coating: CIE 1931 2° tristimulus values, chromaticity, CIELAB and luminous
 * reflectance, from a spectrum sampled on the colour grid (380–780 nm every 5 nm, the range and
 * step CIE 015:2018 gives for practical colorimetry).
 */
import { incidenceAngle, oneOf } from './checks.js';
import {
  CIE1931_START_NM,
  CIE1931_STEP_NM,
  CIE1931_X_BAR,
  CIE1931_Y_BAR,
  CIE1931_Z_BAR,
} from './data/cie1931-2deg.js';
import { D65_SPD, D65_START_NM, D65_STEP_NM } from './data/cie-d65.js';
import { OpticsInputError } from './errors.js';
import {
  BACK_SURFACES,
  POLARISATIONS,
  calculateSpectrum,
  type BackSurface,
  type Polarisation,
} from './batch.js';
import type { OpticalStack } from './stack.js';

/** Illuminants shipped: CIE D65 (daylight) and CIE A (incandescent). */
export type Illuminant = 'D65' | 'A';
export const ILLUMINANTS: readonly Illuminant[] = ['D65', 'A'];

export const COLOUR_START_NM = 380;
export const COLOUR_END_NM = 780;
export const COLOUR_STEP_NM = 5;
/** Number of samples on the colour grid (81). */
export const COLOUR_SAMPLES = (COLOUR_END_NM - COLOUR_START_NM) / COLOUR_STEP_NM + 1;

/** The colour grid: 380, 385, …, 780 nm. Spectra given to the colour functions are sampled here. */
export function colourWavelengthsNm(): Float64Array {
  const out = new Float64Array(COLOUR_SAMPLES);
  for (let i = 0; i < COLOUR_SAMPLES; i++) out[i] = COLOUR_START_NM + i * COLOUR_STEP_NM;
  return out;
}

/**
 * Relative spectral power of CIE illuminant A at a wavelength in nm, from its defining formula
 * (CIE 015:2018; ISO/CIE 11664-2): a Planckian radiator at 2848 K with c₂ = 1.435·10⁷ nm·K,
 * normalised to 100 at 560 nm: S(λ) = 100 (560/λ)⁵ (e^(c₂/(2848·560)) − 1)/(e^(c₂/(2848·λ)) − 1).
 */
export function illuminantA(wavelengthNm: number): number {
  const c2 = 1.435e7;
  const T = 2848;
  return 100 * (560 / wavelengthNm) ** 5 * (Math.expm1(c2 / (T * 560)) / Math.expm1(c2 / (T * wavelengthNm)));
}

/** Relative spectral power of an illuminant at a wavelength on the 5 nm grid of its table. */
export function illuminantPower(illuminant: Illuminant, wavelengthNm: number): number {
  if (illuminant === 'A') return illuminantA(wavelengthNm);
  const i = (wavelengthNm - D65_START_NM) / D65_STEP_NM;
  if (!Number.isInteger(i) || i < 0 || i >= D65_SPD.length) {
    throw new OpticsInputError(
      'wavelengthNm',
      `D65 is tabulated at 300–830 nm in 5 nm steps (got ${wavelengthNm})`,
    );
  }
  return D65_SPD[i];
}

/** Colour-matching functions x̄, ȳ, z̄ of the CIE 1931 2° observer at a 5 nm grid wavelength. */
export function colourMatching(wavelengthNm: number): [number, number, number] {
  const i = (wavelengthNm - CIE1931_START_NM) / CIE1931_STEP_NM;
  if (!Number.isInteger(i) || i < 0 || i >= CIE1931_X_BAR.length) {
    throw new OpticsInputError(
      'wavelengthNm',
      `the CIE 1931 functions are tabulated at 360–830 nm in 5 nm steps (got ${wavelengthNm})`,
    );
  }
  return [CIE1931_X_BAR[i], CIE1931_Y_BAR[i], CIE1931_Z_BAR[i]];
}

interface Weights {
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  white: Float64Array;
}
const weightCache = new Map<Illuminant, Weights>();

/** Tristimulus weights S(λ)·x̄(λ)·k on the colour grid, k = 100/Σ S ȳ (so a perfect reflector has Y = 100). */
function weightsFor(illuminant: Illuminant): Weights {
  const cached = weightCache.get(illuminant);
  if (cached) return cached;
  const x = new Float64Array(COLOUR_SAMPLES);
  const y = new Float64Array(COLOUR_SAMPLES);
  const z = new Float64Array(COLOUR_SAMPLES);
  let norm = 0;
  for (let i = 0; i < COLOUR_SAMPLES; i++) {
    const wl = COLOUR_START_NM + i * COLOUR_STEP_NM;
    const s = illuminantPower(illuminant, wl);
    const [xb, yb, zb] = colourMatching(wl);
    x[i] = s * xb;
    y[i] = s * yb;
    z[i] = s * zb;
    norm += s * yb;
  }
  const k = 100 / norm;
  const white = new Float64Array(3);
  for (let i = 0; i < COLOUR_SAMPLES; i++) {
    x[i] *= k;
    y[i] *= k;
    z[i] *= k;
    white[0] += x[i];
    white[1] += y[i];
    white[2] += z[i];
  }
  const w = { x, y, z, white };
  weightCache.set(illuminant, w);
  return w;
}

/**
 * White point (X, Y, Z) of an illuminant for the 2° observer, Y = 100, summed on the colour grid.
 * D65 gives 95.04, 100, 108.88 (CIE 015:2018 quotes 95.047, 100, 108.883 from 1 nm data).
 */
export function whitePoint(out: Float64Array, illuminant: Illuminant = 'D65'): Float64Array {
  out.set(weightsFor(checkIlluminant(illuminant)).white);
  return out;
}

/**
 * Tristimulus values of a reflectance or transmittance spectrum.
 *
 * @param out receives X, Y, Z (Y = 100 for a perfect reflector), CIE 015:2018:
 *   X = k Σ S(λ) x̄(λ) R(λ) Δλ with k = 100/Σ S(λ) ȳ(λ) Δλ.
 * @param spectrum fractions 0–1 on the colour grid (COLOUR_SAMPLES values, 380–780 nm by 5 nm).
 */
export function tristimulus(
  out: Float64Array,
  spectrum: ArrayLike<number>,
  illuminant: Illuminant = 'D65',
): Float64Array {
  if (spectrum.length !== COLOUR_SAMPLES) {
    throw new OpticsInputError(
      'spectrum',
      `must hold ${COLOUR_SAMPLES} values on 380–780 nm in 5 nm steps (got ${spectrum.length})`,
    );
  }
  const w = weightsFor(checkIlluminant(illuminant));
  let X = 0;
  let Y = 0;
  let Z = 0;
  for (let i = 0; i < COLOUR_SAMPLES; i++) {
    const r = spectrum[i];
    X += w.x[i] * r;
    Y += w.y[i] * r;
    Z += w.z[i] * r;
  }
  out[0] = X;
  out[1] = Y;
  out[2] = Z;
  return out;
}

/** Chromaticity: out[0] = x = X/(X+Y+Z), out[1] = y = Y/(X+Y+Z) (NaN for black). */
export function chromaticity(out: Float64Array, xyz: ArrayLike<number>): Float64Array {
  const sum = xyz[0] + xyz[1] + xyz[2];
  out[0] = xyz[0] / sum;
  out[1] = xyz[1] / sum;
  return out;
}

/**
 * CIELAB (ISO/CIE 11664-4; CIE 015:2018): L* = 116 f(Y/Yn) − 16, a* = 500 (f(X/Xn) − f(Y/Yn)),
 * b* = 200 (f(Y/Yn) − f(Z/Zn)), f(t) = t^(1/3) above (6/29)³ and t/(3·(6/29)²) + 4/29 below.
 * @param out receives L*, a*, b*. @param white the reference white (Xn, Yn, Zn), same scale as xyz.
 */
export function xyzToLab(out: Float64Array, xyz: ArrayLike<number>, white: ArrayLike<number>): Float64Array {
  const fx = labF(xyz[0] / white[0]);
  const fy = labF(xyz[1] / white[1]);
  const fz = labF(xyz[2] / white[2]);
  out[0] = 116 * fy - 16;
  out[1] = 500 * (fx - fy);
  out[2] = 200 * (fy - fz);
  return out;
}

const LAB_EPSILON = (6 / 29) ** 3;
function labF(t: number): number {
  return t > LAB_EPSILON ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29;
}

/**
 * Luminous (photopic) reflectance or transmittance, a fraction: Rv = Σ R S ȳ / Σ S ȳ on the colour
 * grid, S = D65 by default (the usual definition for ophthalmic AR coatings, e.g. ISO 13666).
 */
export function luminousFraction(spectrum: ArrayLike<number>, illuminant: Illuminant = 'D65'): number {
  const xyz = tristimulus(new Float64Array(3), spectrum, illuminant);
  return xyz[1] / 100;
}

/** Colour of the light a coating reflects. */
export interface ColourResult {
  X: number;
  Y: number;
  Z: number;
  x: number;
  y: number;
  L: number;
  a: number;
  b: number;
  /** Luminous reflectance, fraction 0–1 (Y/100). */
  Rv: number;
}

export interface ColourOptions {
  /** Angle of incidence in degrees (0 when omitted). */
  angleDeg?: number;
  /** `avg` (unpolarised, default), `s` or `p`. */
  polarisation?: Polarisation;
  /** Illuminant for XYZ, Lab and Rv; D65 when omitted. CIELAB uses its white point. */
  illuminant?: Illuminant;
  /** Substrate treatment (see SpectrumOptions); `none` when omitted. */
  back?: BackSurface;
}

/** Colour of a spectrum (fractions on the colour grid) under an illuminant. */
export function spectrumColour(spectrum: ArrayLike<number>, illuminant: Illuminant = 'D65'): ColourResult {
  const xyz = tristimulus(new Float64Array(3), spectrum, illuminant);
  const xy = chromaticity(new Float64Array(2), xyz);
  const lab = xyzToLab(new Float64Array(3), xyz, whitePoint(new Float64Array(3), illuminant));
  return {
    X: xyz[0],
    Y: xyz[1],
    Z: xyz[2],
    x: xy[0],
    y: xy[1],
    L: lab[0],
    a: lab[1],
    b: lab[2],
    Rv: xyz[1] / 100,
  };
}

/** Reflected colour and luminous reflectance of a stack at one angle of incidence. */
export function reflectedColour(stack: OpticalStack, options: ColourOptions = {}): ColourResult {
  const angleDeg = incidenceAngle(options.angleDeg ?? 0, 'angleDeg');
  const polarisation = oneOf(options.polarisation ?? 'avg', POLARISATIONS, 'polarisation');
  const back = oneOf(options.back ?? 'none', BACK_SURFACES, 'back');
  const spectrum = calculateSpectrum(
    stack,
    { wavelengthsNm: colourWavelengthsNm(), anglesDeg: [angleDeg], polarisations: [polarisation] },
    { back },
  );
  return spectrumColour(spectrum.R, checkIlluminant(options.illuminant ?? 'D65'));
}

function checkIlluminant(value: Illuminant): Illuminant {
  return oneOf(value, ILLUMINANTS, 'illuminant');
}
