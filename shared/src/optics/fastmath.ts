/*
 * Trigonometry for the kernels. The transfer-matrix kernel needs sin and cos of the same phase for
 * every layer at every point, and Math.sin/Math.cos each reduce the argument separately (and are
 * slow for large arguments); here one reduction serves both.
 *
 * Method: x = n·(π/128) + r with |r| ≤ π/256 (Cody–Waite reduction with π/128 split in three
 * parts), short Taylor series for sin r and cos r, then the angle-addition formulas with a 256-entry
 * table of sin and cos at multiples of π/128.
 */

const SPLIT = 134217729; // 2^27 + 1, Veltkamp splitting
const STEP = Math.PI / 128;
// π/128 = STEP_HI + STEP_MID + STEP_LO: STEP_HI has 26 significant bits and STEP_MID =
// Math.PI/128 − STEP_HI (exact) at most 27, so n·STEP_HI and n·STEP_MID are exact for |n| < 2^26.
// STEP_LO = (π − Math.PI)/128 = (π/2 − Math.PI/2)/64, and π/2 − Math.PI/2 is cos(Math.PI/2) to full
// precision since cos(π/2 − ε) = sin ε ≈ ε.
const STEP_HI = SPLIT * STEP - (SPLIT * STEP - STEP);
const STEP_MID = STEP - STEP_HI;
const STEP_LO = Math.cos(Math.PI / 2) / 64;
const INV_STEP = 128 / Math.PI;
/**
 * Adding and subtracting 1.5·2^52 rounds a double to the nearest integer (ties to even) for
 * |v| < 2^51, several times faster than Math.round in V8; which way ties go does not matter here.
 */
const ROUNDER = 6755399441055744;
/** Keeps |n| < 2^26 (see above); beyond it fall back to Math.sin/Math.cos. */
const REDUCTION_LIMIT = 1.5e6;

// Taylor coefficients; on |r| ≤ π/256 the first omitted terms (r⁷/7!, r⁸/8!) are below 1e-17.
const S1 = -1 / 6;
const S2 = 1 / 120;
const C2 = 1 / 24;
const C3 = -1 / 720;

/** sin(jπ/128) and cos(jπ/128), j = 0…255, each correct to about half an ulp. */
const TABLE_SIN = new Float64Array(256);
const TABLE_COS = new Float64Array(256);
for (let j = 0; j < 256; j++) {
  // a = fl(j·STEP) misses the exact jπ/128 by e; first-order correction sin(a + e) ≈ sin a + e cos a.
  const a = j * STEP;
  const e = j * STEP_HI - a + j * STEP_MID + j * STEP_LO;
  TABLE_SIN[j] = Math.sin(a) + e * Math.cos(a);
  TABLE_COS[j] = Math.cos(a) - e * Math.sin(a);
}

/**
 * sin(x) into out[offset] and cos(x) into out[offset + 1], x in radians. Agrees with Math.sin and
 * Math.cos to within a few 1e-16 for |x| < 1.5·10⁶ and is exactly them beyond. Allocates nothing and
 * never throws (NaN in, NaN out).
 */
export function sinCos(out: Float64Array, offset: number, x: number): Float64Array {
  if (!(Math.abs(x) < REDUCTION_LIMIT)) {
    out[offset] = Math.sin(x);
    out[offset + 1] = Math.cos(x);
    return out;
  }
  const n = x * INV_STEP + ROUNDER - ROUNDER;
  const r = x - n * STEP_HI - n * STEP_MID - n * STEP_LO;
  const z = r * r;
  const s = r + r * z * (S1 + z * S2);
  const c = 1 - 0.5 * z + z * z * (C2 + z * C3);
  const j = n & 255;
  const ts = TABLE_SIN[j];
  const tc = TABLE_COS[j];
  out[offset] = ts * c + tc * s;
  out[offset + 1] = tc * c - ts * s;
  return out;
}
