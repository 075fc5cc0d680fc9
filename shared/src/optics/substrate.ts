/*
 * Thick substrate seen by a spectrophotometer: the substrate is far thicker than the coherence length
 * of the measuring light, so its multiple reflections add in intensity, not amplitude. Standard
 * result (Macleod, Thin-Film Optical Filters, ch. 2): with front coating Rf, Tf (from outside) and
 * Rf′, Tf′ (from inside the substrate), back surface Rb, Tb (from inside), and single-pass internal
 * transmittance τ,
 *     R = Rf + Tf·Tf′·Rb·τ² / (1 − Rf′·Rb·τ²),   T = Tf·Tb·τ / (1 − Rf′·Rb·τ²).
 * Each polarisation is combined on its own; unpolarised light averages the combined s and p.
 */

/**
 * Single-pass intensity transmittance of a substrate: τ = exp(−2·k0·Im(q)·d) with
 * q = √(N² − β²) = N cos θ inside the substrate. At normal incidence this is exp(−4πkd/λ)
 * (Born & Wolf). Allocates nothing, never throws.
 *
 * @param k0 2π/λ in nm⁻¹; @param beta Snell invariant N₀ sin θ₀;
 * @param epsRe, epsIm substrate permittivity N²; @param thicknessNm substrate thickness in nm.
 */
export function substratePassTransmittance(
  k0: number,
  beta: number,
  epsRe: number,
  epsIm: number,
  thicknessNm: number,
): number {
  if (thicknessNm === 0) return 1;
  const x = epsRe - beta * beta;
  // Im √(x + iy) for y ≥ 0, cancellation-free.
  const m = Math.sqrt(0.5 * (Math.sqrt(x * x + epsIm * epsIm) + Math.abs(x)));
  const im = m === 0 ? 0 : x >= 0 ? epsIm / (2 * m) : m;
  return Math.exp(-2 * k0 * im * thicknessNm);
}

/**
 * Incoherent combination of the front coating, the substrate pass and the back surface.
 *
 * @param out receives R at out[offset], T at out[offset + 1], A = 1 − R − T at out[offset + 2].
 * @param frontR, frontT front coating from the incident side; frontBackR, frontBackT the same
 *   coating seen from inside the substrate; backR, backT back surface from inside; tau single-pass
 *   internal transmittance.
 * @returns out. Allocates nothing, never throws; with no light entering the substrate (frontT = 0,
 *   e.g. total internal reflection at the front) R = frontR and T = 0.
 */
export function combineIncoherent(
  out: Float64Array,
  offset: number,
  frontR: number,
  frontT: number,
  frontBackR: number,
  frontBackT: number,
  backR: number,
  backT: number,
  tau: number,
): Float64Array {
  let R = frontR;
  let T = 0;
  if (frontT > 0) {
    const tau2 = tau * tau;
    const denom = 1 - frontBackR * backR * tau2;
    R = frontR + (frontT * frontBackT * backR * tau2) / denom;
    T = (frontT * backT * tau) / denom;
  }
  R = Math.min(1, R);
  T = Math.min(1 - R, T);
  out[offset] = R;
  out[offset + 1] = T;
  out[offset + 2] = 1 - R - T;
  return out;
}
