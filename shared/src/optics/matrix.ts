/*
 * The transfer-matrix (characteristic-matrix) kernel: reflectance, transmittance and absorptance of
 * a thin-film stack between two semi-infinite media, at one wavelength and one angle, for s and/or p.
 *
 * Conventions (see shared/README.md):
 * - Time dependence exp(−iωt), so a forward wave is exp(i(kz − ωt)) and N = n + ik with k ≥ 0
 *   decays along +z: |E|² ∝ exp(−4πkz/λ) (Born & Wolf). The layer matrix of Macleod (who writes
 *   exp(+iωt) and N = n − ik) becomes its complex conjugate:
 *       M = [[cos δ, −i sin δ / η], [−i η sin δ, cos δ]],  δ = 2π q d / λ.
 * - q = N cos θ = √(N² − β²) with β = N₀ sin θ₀ (Snell's invariant). The root is taken with
 *   Im q ≥ 0 (and Re q ≥ 0 when q is real), i.e. the wave decays or propagates forward — for
 *   evanescent waves beyond the critical angle as well as in absorbing media.
 * - Tilted admittances in units of the free-space admittance: η_s = q, η_p = N²/q.
 * - Layers are ordered from the incident side to the exit side.
 *
 * For [B; C] = M₁⋯M_L [1; η_exit]: r = (η₀B − C)/(η₀B + C), t = 2η₀/(η₀B + C) (tangential E),
 * R = |r|², T = Re(η_exit)|t|²/Re(η₀), A = 1 − R − T (Macleod, Thin-Film Optical Filters, ch. 2).
 */
import { sinCos } from './fastmath.js';

/** Polarisation mask for {@link coherentResponse}: s only, p only, or both from one pass. */
export const POL_S = 1;
export const POL_P = 2;
export const POL_BOTH = 3;

/** Numbers written per polarisation by {@link coherentResponse}: R, T, A, Re r, Im r, Re t, Im t. */
export const RESPONSE_STRIDE = 7;
/** Offsets inside one polarisation's block of {@link coherentResponse} output. */
export const RESP_R = 0;
export const RESP_T = 1;
export const RESP_A = 2;
export const RESP_R_RE = 3;
export const RESP_R_IM = 4;
export const RESP_T_RE = 5;
export const RESP_T_IM = 6;

/** Below this |Im δ| the layer's cosh/sinh come from their series, unscaled. */
const SMALL_DECAY = 0.01;
/** Keeps q = 0 (grazing propagation exactly at a layer's index) finite: the limit is continuous. */
const TINY_Q = 1e-150;
/** Running [B; C] is renormalised when it grows past this, to avoid overflow in very long stacks. */
const RESCALE_ABOVE = 1e150;

// Scratch for sinCos and the media's roots; module-level so the kernel allocates nothing (each
// worker thread has its own module instance).
const TRIG = new Float64Array(2);
const ROOT = new Float64Array(2);

/** Writes √(x + iy) with Im ≥ 0 (and Re ≥ 0 when the root is real) into out[0..1]; y ≥ 0. */
export function forwardRoot(out: Float64Array, x: number, y: number): void {
  if (y === 0) {
    out[0] = x > 0 ? Math.sqrt(x) : x === 0 ? TINY_Q : 0;
    out[1] = x < 0 ? Math.sqrt(-x) : 0;
    return;
  }
  // Cancellation-free principal root; for y > 0 it has Re > 0 and Im > 0.
  const m = Math.sqrt(0.5 * (Math.sqrt(x * x + y * y) + Math.abs(x)));
  const w = y / (2 * m);
  out[0] = x >= 0 ? m : w;
  out[1] = x >= 0 ? w : m;
}

/**
 * The layers one call of {@link coherentResponse} runs through, as a struct of arrays: layer l has
 * relative permittivity ε = N² = epsRe[epsOffset + l] + i·epsIm[epsOffset + l] (epsIm = 2nk ≥ 0)
 * and physical thickness thicknessNm[thicknessOffset + l] in nm. With `reversed` the layers are met
 * in the opposite order (light arriving from the exit side), which the incoherent substrate model
 * needs. Callers keep one span per layer list and move `epsOffset` from wavelength to wavelength.
 */
export interface LayerSpan {
  epsRe: Float64Array;
  epsIm: Float64Array;
  epsOffset: number;
  thicknessNm: Float64Array;
  thicknessOffset: number;
  layerCount: number;
  reversed: boolean;
}

/** The light and the two bounding media of one call of {@link coherentResponse}. */
export interface CoherentMedia {
  /** Free-space wavenumber 2π/λ in nm⁻¹. */
  k0: number;
  /** Snell invariant N₀ sin θ₀ (real). */
  beta: number;
  /**
   * ε of the incident medium, real and imaginary part (imaginary > 0 only for light arriving from
   * inside an absorbing substrate).
   */
  incRe: number;
  incIm: number;
  /** ε of the exit medium. */
  exitRe: number;
  exitIm: number;
  /** {@link POL_S}, {@link POL_P} or {@link POL_BOTH}. */
  polMask: number;
}

/**
 * Coherent response of a layer stack at one wavelength and one angle of incidence.
 *
 * @param out receives, for s at 0…6 and for p at 7…13 (only the requested ones are written):
 *   R, T, A (fractions), then Re r, Im r, Re t, Im t. r and t are ratios of the tangential electric
 *   field (so r_s = r_p and t_s = t_p at normal incidence).
 * @param layers the layers, see {@link LayerSpan}; @param media the light and the media around them.
 * @returns out. Allocates nothing and never throws; callers validate inputs.
 */
export function coherentResponse(out: Float64Array, layers: LayerSpan, media: CoherentMedia): Float64Array {
  const { epsRe, epsIm, epsOffset, thicknessNm, thicknessOffset, layerCount, reversed } = layers;
  const { k0, beta, incRe, incIm, exitRe, exitIm, polMask } = media;
  const wantS = (polMask & POL_S) !== 0;
  const wantP = (polMask & POL_P) !== 0;
  const beta2 = beta * beta;

  // The running vectors [B; C] start as [1; η_exit]: η_s = q, η_p = ε/q.
  forwardRoot(ROOT, exitRe - beta2, exitIm);
  const qmRe = ROOT[0];
  const qmIm = ROOT[1];
  const qm2 = qmRe * qmRe + qmIm * qmIm;
  const pmRe = (exitRe * qmRe + exitIm * qmIm) / qm2;
  const pmIm = (exitIm * qmRe - exitRe * qmIm) / qm2;
  let sBr = 1;
  let sBi = 0;
  let sCr = qmRe;
  let sCi = qmIm;
  let pBr = 1;
  let pBi = 0;
  let pCr = pmRe;
  let pCi = pmIm;
  // Natural logs of the factors divided out of [B; C]; r is unaffected, t is scaled back at the end.
  let sLog = 0;
  let pLog = 0;

  for (let i = 0; i < layerCount; i++) {
    const l = reversed ? i : layerCount - 1 - i;
    const er = epsRe[epsOffset + l];
    const ei = epsIm[epsOffset + l];
    const kd = k0 * thicknessNm[thicknessOffset + l];
    const x = er - beta2;
    // q = √(ε − β²) on the forward branch: forwardRoot written out, which keeps the loop body
    // inside V8's inlining budget (sinCos and finish stay inlined).
    let qr: number;
    let qi: number;
    if (ei === 0) {
      qr = x > 0 ? Math.sqrt(x) : x === 0 ? TINY_Q : 0;
      qi = x < 0 ? Math.sqrt(-x) : 0;
    } else {
      const m = Math.sqrt(0.5 * (Math.sqrt(x * x + ei * ei) + Math.abs(x)));
      const w = ei / (2 * m);
      qr = x >= 0 ? m : w;
      qi = x >= 0 ? w : m;
    }
    sinCos(TRIG, 0, kd * qr);
    const sa = TRIG[0];
    const ca = TRIG[1];

    if (qi === 0) {
      // Lossless layer below its critical angle: real δ, real admittance, real matrix elements.
      // B' = cos δ·B − i a·C ;  C' = −i g·B + cos δ·C   with a = sin δ/η, g = η sin δ.
      if (wantS) {
        const a = sa / qr;
        const g = qr * sa;
        const br = ca * sBr + a * sCi;
        const bi = ca * sBi - a * sCr;
        const cr = ca * sCr + g * sBi;
        const ci = ca * sCi - g * sBr;
        sBr = br;
        sBi = bi;
        sCr = cr;
        sCi = ci;
      }
      if (wantP) {
        const a = (sa * qr) / er;
        const g = (er * sa) / qr;
        const br = ca * pBr + a * pCi;
        const bi = ca * pBi - a * pCr;
        const cr = ca * pCr + g * pBi;
        const ci = ca * pCi - g * pBr;
        pBr = br;
        pBi = bi;
        pCr = cr;
        pCi = ci;
      }
    } else {
      // Absorbing layer or evanescent wave: δ = a + ib with b = kd·Im q ≥ 0.
      const b = kd * qi;
      let ch: number;
      let sh: number;
      if (b < SMALL_DECAY) {
        const b2 = b * b;
        ch = 1 + b2 * (0.5 + b2 * (1 / 24 + b2 * (1 / 720 + b2 * (1 / 40320 + b2 / 3628800))));
        sh = b * (1 + b2 * (1 / 6 + b2 * (1 / 120 + b2 * (1 / 5040 + b2 / 362880))));
      } else {
        // cosh b and sinh b times e^(−b): bounded, so thick absorbers and tunnelling never overflow.
        const em = Math.expm1(-2 * b);
        ch = 1 + 0.5 * em;
        sh = -0.5 * em;
        sLog += b;
        pLog += b;
      }
      // cos δ = cos a cosh b − i sin a sinh b ;  sin δ = sin a cosh b + i cos a sinh b
      const cdr = ca * ch;
      const cdi = -sa * sh;
      const sdr = sa * ch;
      const sdi = ca * sh;
      // u = sin δ / q, v = q sin δ
      const inv = 1 / (qr * qr + qi * qi);
      const ur = (sdr * qr + sdi * qi) * inv;
      const ui = (sdi * qr - sdr * qi) * inv;
      const vr = qr * sdr - qi * sdi;
      const vi = qr * sdi + qi * sdr;
      if (wantS) {
        // a = sin δ/η_s = u, g = η_s sin δ = v; −i·a = (ai, −ar).
        const br = cdr * sBr - cdi * sBi + (ui * sCr + ur * sCi);
        const bi = cdr * sBi + cdi * sBr + (ui * sCi - ur * sCr);
        const cr = vi * sBr + vr * sBi + (cdr * sCr - cdi * sCi);
        const ci = vi * sBi - vr * sBr + (cdr * sCi + cdi * sCr);
        sBr = br;
        sBi = bi;
        sCr = cr;
        sCi = ci;
      }
      if (wantP) {
        // a = sin δ/η_p = v/ε, g = η_p sin δ = ε·u.
        const e2inv = 1 / (er * er + ei * ei);
        const ar = (vr * er + vi * ei) * e2inv;
        const ai = (vi * er - vr * ei) * e2inv;
        const gr = er * ur - ei * ui;
        const gi = er * ui + ei * ur;
        const br = cdr * pBr - cdi * pBi + (ai * pCr + ar * pCi);
        const bi = cdr * pBi + cdi * pBr + (ai * pCi - ar * pCr);
        const cr = gi * pBr + gr * pBi + (cdr * pCr - cdi * pCi);
        const ci = gi * pBi - gr * pBr + (cdr * pCi + cdi * pCr);
        pBr = br;
        pBi = bi;
        pCr = cr;
        pCi = ci;
      }
    }

    if ((i & 31) === 31) {
      // Long lossless stacks can grow [B; C] geometrically; divide the growth out now and then.
      const ms = Math.max(Math.abs(sBr), Math.abs(sBi), Math.abs(sCr), Math.abs(sCi));
      if (ms > RESCALE_ABOVE) {
        sBr /= ms;
        sBi /= ms;
        sCr /= ms;
        sCi /= ms;
        sLog += Math.log(ms);
      }
      const mp = Math.max(Math.abs(pBr), Math.abs(pBi), Math.abs(pCr), Math.abs(pCi));
      if (mp > RESCALE_ABOVE) {
        pBr /= mp;
        pBi /= mp;
        pCr /= mp;
        pCi /= mp;
        pLog += Math.log(mp);
      }
    }
  }

  forwardRoot(ROOT, incRe - beta2, incIm);
  const q0Re = ROOT[0];
  const q0Im = ROOT[1];
  if (wantS) finish(out, 0, q0Re, q0Im, qmRe, sBr, sBi, sCr, sCi, sLog);
  if (wantP) {
    const q02 = q0Re * q0Re + q0Im * q0Im;
    const p0Re = (incRe * q0Re + incIm * q0Im) / q02;
    const p0Im = (incIm * q0Re - incRe * q0Im) / q02;
    finish(out, RESPONSE_STRIDE, p0Re, p0Im, pmRe, pBr, pBi, pCr, pCi, pLog);
  }
  return out;
}

/**
 * r, t, R, T, A into out[o…o+6] from the incident admittance η₀ = (e0r, e0i), the real part of
 * the exit admittance and the final [B; C], which was divided by e^log along the way.
 */
function finish(
  out: Float64Array,
  o: number,
  e0r: number,
  e0i: number,
  exitAdmRe: number,
  Br: number,
  Bi: number,
  Cr: number,
  Ci: number,
  log: number,
): void {
  const ebr = e0r * Br - e0i * Bi;
  const ebi = e0r * Bi + e0i * Br;
  const dr = ebr + Cr;
  const di = ebi + Ci;
  const nr = ebr - Cr;
  const ni = ebi - Ci;
  const d2 = dr * dr + di * di;
  const rr = (nr * dr + ni * di) / d2;
  const ri = (ni * dr - nr * di) / d2;
  const scale = log === 0 ? 1 : Math.exp(-log);
  const tr = ((2 * (e0r * dr + e0i * di)) / d2) * scale;
  const ti = ((2 * (e0i * dr - e0r * di)) / d2) * scale;
  // Rounding can put R a few ulps above 1 (total internal reflection) or R + T above 1: clamp so
  // 0 ≤ R, T, A ≤ 1 and A = (1 − R) − T ≥ 0.
  const R = Math.min(1, rr * rr + ri * ri);
  // T = Re(η_exit)|t|²/Re(η₀); zero when no power flows in the incident medium's normal direction.
  const T = e0r > 0 ? Math.min(1 - R, (exitAdmRe * (tr * tr + ti * ti)) / e0r) : 0;
  out[o + RESP_R] = R;
  out[o + RESP_T] = T;
  out[o + RESP_A] = 1 - R - T;
  out[o + RESP_R_RE] = rr;
  out[o + RESP_R_IM] = ri;
  out[o + RESP_T_RE] = tr;
  out[o + RESP_T_IM] = ti;
}
