/*
 * Measured spectra against a spec mask: a spectrophotometer's R or T at one angle, interpolated at
 * each limit band's sample wavelengths. Bands the measurement does not cover (another quantity,
 * angle or polarisation, or wavelengths outside the scan) are reported as not evaluated, never as
 * passing.
 */
import { elementAt } from './checked.js';
import { OpticsInputError } from './optics/errors.js';
import { bandMargin, bandWavelengthsNm, validateSpecMask, type SpecMask } from './optics/mask.js';

export interface MeasuredSpectrum {
  quantity: 'R' | 'T';
  /** Angle of incidence of the measurement, degrees. */
  angleDeg: number;
  /** Strictly increasing, nm. */
  wavelengthsNm: readonly number[];
  valuesPercent: readonly number[];
}

export interface MeasuredBandResult {
  band: number;
  label?: string;
  evaluated: boolean;
  /** Why a band was not evaluated. */
  reason?: string;
  pass?: boolean;
  worstMargin?: number;
  worstAt?: { wavelengthNm: number; valuePercent: number };
}

export interface MeasuredMaskResult {
  /** True when every band was evaluated and passed; false when one failed; null when none could be evaluated. */
  pass: boolean | null;
  worstMargin: number | null;
  /** Index of the evaluated band with that worst margin (the first of equals); null when none was evaluated. */
  worstBand: number | null;
  bands: MeasuredBandResult[];
}

/**
 * How close the measurement angle must be to a band's angle to count (degrees). Spectrophotometer
 * "near-normal" accessories measure at a few degrees; common practice (no source) treats up to 8°
 * as normal incidence for AR work, where R hardly changes.
 */
export const ANGLE_TOLERANCE_DEG = 8;

/** Linear interpolation of a strictly increasing table; null outside it. */
export function interpolate(xs: readonly number[], ys: readonly number[], x: number): number | null {
  const first = xs[0];
  const last = xs[xs.length - 1];
  if (first === undefined || last === undefined || x < first || x > last) return null;
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (elementAt(xs, mid, 'the wavelengths') <= x) lo = mid;
    else hi = mid;
  }
  const [x0, x1] = [elementAt(xs, lo, 'the wavelengths'), elementAt(xs, hi, 'the wavelengths')];
  const [y0, y1] = [elementAt(ys, lo, 'the values'), elementAt(ys, hi, 'the values')];
  if (x1 === x0) return y0;
  return y0 + ((x - x0) / (x1 - x0)) * (y1 - y0);
}

/** Evaluates a measured spectrum against a mask, band by band (margins in percentage points). */
export function evaluateMaskOnMeasured(mask: SpecMask, measured: MeasuredSpectrum): MeasuredMaskResult {
  const checked = validateSpecMask(mask);
  const { wavelengthsNm: xs, valuesPercent: ys } = measured;
  const [scanFrom, scanTo] = [xs[0], xs[xs.length - 1]];
  if (scanFrom === undefined || scanTo === undefined || xs.length < 2 || xs.length !== ys.length) {
    throw new OpticsInputError('measured', 'needs at least 2 wavelengths and one value per wavelength');
  }
  const bands = checked.bands.map((band, i): MeasuredBandResult => {
    const base = { band: i, ...(band.label ? { label: band.label } : {}) };
    if (band.quantity !== measured.quantity) {
      return {
        ...base,
        evaluated: false,
        reason: `the band limits ${band.quantity}; ${measured.quantity} was measured`,
      };
    }
    const angles = band.angles_deg ?? [0];
    if (!angles.some((a) => Math.abs(a - measured.angleDeg) <= ANGLE_TOLERANCE_DEG)) {
      return {
        ...base,
        evaluated: false,
        reason: `measured at ${measured.angleDeg}°; the band asks for ${angles.join(', ')}°`,
      };
    }
    if (band.from_nm < scanFrom || band.to_nm > scanTo) {
      return {
        ...base,
        evaluated: false,
        reason: `the scan covers ${scanFrom}–${scanTo} nm; the band needs ${band.from_nm}–${band.to_nm} nm`,
      };
    }
    let worst = Infinity;
    let at = { wavelengthNm: band.from_nm, valuePercent: NaN };
    for (const wl of bandWavelengthsNm(band)) {
      const value = interpolate(xs, ys, wl) as number;
      const m = bandMargin(band, value);
      if (m < worst) {
        worst = m;
        at = { wavelengthNm: wl, valuePercent: value };
      }
    }
    return { ...base, evaluated: true, pass: worst >= 0, worstMargin: worst, worstAt: at };
  });
  const evaluated = bands.filter((b) => b.evaluated);
  let worstBand: number | null = null;
  let worstMargin: number | null = null;
  for (const [i, b] of bands.entries()) {
    if (b.evaluated && (worstMargin === null || (b.worstMargin as number) < worstMargin)) {
      worstBand = i;
      worstMargin = b.worstMargin as number;
    }
  }
  let pass: boolean | null = null;
  if (evaluated.some((b) => !b.pass)) pass = false;
  else if (evaluated.length === bands.length) pass = true;
  return { pass, worstMargin, worstBand, bands };
}
