/*
 * Standard uncertainties of fitted layer thicknesses, from the linearised least-squares problem at
 * the solution: Cov(d) ≈ s²·(JᵀJ)⁻¹ with s² = Σr²/(n − p), n the fitted samples and p the free
 * layers (W. H. Press et al., Numerical Recipes, 3rd ed., §15.5 "Nonlinear Models", eq. 15.5.15
 * with the unknown measurement σ replaced by the residual estimate, §15.1). A layer whose
 * thickness the spectrum hardly constrains (a very thin layer, or one that trades off exactly
 * against a neighbour) gets a large σ; a singular JᵀJ gives no uncertainty at all (null). The
 * correlation of two layers' thicknesses, ρ_jk = C_jk/√(C_jj·C_kk), shows the pairs the spectrum
 * cannot tell apart (one thicker, the other thinner, the same spectrum).
 */
import { OpticsInputError } from '../optics/errors.js';
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import { createMaskMerit, type MaskMerit, type MaskMeritOptions } from './merit.js';

/** Central-difference step for the Jacobian where analytic derivatives are not available, nm. */
const FD_STEP_NM = 1e-3;

export interface ThicknessUncertainty {
  /** Standard uncertainty of each front layer's thickness, nm; null where it cannot be estimated. */
  sigmaNm: (number | null)[];
  /**
   * Correlation of the fitted thicknesses, p×p row by row (ρ_jj = 1); null where JᵀJ is singular
   * or a variance is not positive.
   */
  correlation: (number | null)[][];
  /** s = √(Σr²/(n − p)), the residual scale (percentage points × sample weight). */
  residualScale: number;
  /** n − p. */
  degreesOfFreedom: number;
}

/**
 * {@link thicknessUncertainty} for a fit of `stack` to `mask` and `options.targets` (as Fit to mask
 * was called), at the fitted `thicknessesNm`; `fittedSamples` is the number of target points.
 */
export function fitUncertainty(
  stack: OpticalStack,
  mask: SpecMask,
  options: MaskMeritOptions,
  thicknessesNm: readonly number[],
  fittedSamples: number,
): ThicknessUncertainty {
  return thicknessUncertainty(createMaskMerit(stack, mask, options), thicknessesNm, fittedSamples);
}

/**
 * Standard uncertainties of all front layers of `merit` at `thicknessesNm` (the fitted solution),
 * `fittedSamples` being how many of the merit's samples the fit follows (the measured points).
 * Throws {@link OpticsInputError} when there are no more samples than layers.
 */
export function thicknessUncertainty(
  merit: MaskMerit,
  thicknessesNm: readonly number[],
  fittedSamples: number,
): ThicknessUncertainty {
  const p = merit.layerCount;
  if (thicknessesNm.length !== p) {
    throw new OpticsInputError(
      'thicknessesNm',
      `needs one value per layer (${p}, got ${thicknessesNm.length})`,
    );
  }
  const dof = fittedSamples - p;
  if (!(dof > 0)) {
    throw new OpticsInputError('fittedSamples', `needs more samples than layers (${fittedSamples} ≤ ${p})`);
  }
  const m = merit.sampleCount;
  const free = Array.from({ length: p }, (_, i) => i);
  const jac = new Float64Array(m * p);
  const r = new Float64Array(m);
  const sum = merit.residuals(r, thicknessesNm);
  if (merit.analyticDerivatives) {
    merit.jacobian(jac, thicknessesNm, free);
  } else {
    const x = Float64Array.from(thicknessesNm);
    const plus = new Float64Array(m);
    const minus = new Float64Array(m);
    for (let j = 0; j < p; j++) {
      const h = Math.min(FD_STEP_NM, x[j] / 2);
      x[j] = thicknessesNm[j] + h;
      merit.residuals(plus, x);
      x[j] = thicknessesNm[j] - h;
      merit.residuals(minus, x);
      x[j] = thicknessesNm[j];
      for (let s = 0; s < m; s++) jac[s * p + j] = (plus[s] - minus[s]) / (2 * h);
    }
    merit.compute(thicknessesNm);
  }
  const s2 = sum / dof;
  const a = new Float64Array(p * p);
  for (let s = 0; s < m; s++) {
    for (let j = 0; j < p; j++) {
      const jj = jac[s * p + j];
      if (jj === 0) continue;
      for (let k = 0; k < p; k++) a[j * p + k] += jj * jac[s * p + k];
    }
  }
  const inverse = invertSymmetric(a, p);
  const sigmaNm = Array.from({ length: p }, (_, j) => {
    if (!inverse) return null;
    const v = inverse[j * p + j] * s2;
    return v >= 0 && Number.isFinite(v) ? Math.sqrt(v) : null;
  });
  const correlation = Array.from({ length: p }, (_, j) =>
    Array.from({ length: p }, (_, k) => {
      if (!inverse || sigmaNm[j] === null || sigmaNm[k] === null) return null;
      const rho = inverse[j * p + k] / Math.sqrt(inverse[j * p + j] * inverse[k * p + k]);
      return Number.isFinite(rho) ? Math.max(-1, Math.min(1, rho)) : null;
    }),
  );
  return { sigmaNm, correlation, residualScale: Math.sqrt(s2), degreesOfFreedom: dof };
}

/**
 * Inverse of a symmetric positive-definite p×p matrix by Gauss–Jordan elimination with partial
 * pivoting; null when a pivot falls below 1e-12 of the largest diagonal entry (singular).
 */
function invertSymmetric(a: Float64Array, p: number): Float64Array | null {
  const w = Float64Array.from(a);
  const inv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) inv[i * p + i] = 1;
  let scale = 0;
  for (let i = 0; i < p; i++) scale = Math.max(scale, Math.abs(a[i * p + i]));
  if (scale === 0) return null;
  for (let c = 0; c < p; c++) {
    let pivot = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(w[r * p + c]) > Math.abs(w[pivot * p + c])) pivot = r;
    if (Math.abs(w[pivot * p + c]) < 1e-12 * scale) return null;
    if (pivot !== c) {
      for (let k = 0; k < p; k++) {
        [w[c * p + k], w[pivot * p + k]] = [w[pivot * p + k], w[c * p + k]];
        [inv[c * p + k], inv[pivot * p + k]] = [inv[pivot * p + k], inv[c * p + k]];
      }
    }
    const d = w[c * p + c];
    for (let k = 0; k < p; k++) {
      w[c * p + k] /= d;
      inv[c * p + k] /= d;
    }
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = w[r * p + c];
      if (f === 0) continue;
      for (let k = 0; k < p; k++) {
        w[r * p + k] -= f * w[c * p + k];
        inv[r * p + k] -= f * inv[c * p + k];
      }
    }
  }
  return inv;
}
