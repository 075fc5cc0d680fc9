/*
 * Analytic derivatives of the coherent front surface (back `none`) from the characteristic-matrix
 * products from the front and from the back: one forward and one backward sweep per wavelength,
 * angle and polarisation give ∂R/∂d and ∂T/∂d for every layer at once, and the needle function
 * (the first-order change when an infinitely thin layer is inserted at depth z).
 *
 * Conventions as matrix.ts (exp(−iωt), N = n + ik, q = √(ε − β²) with Im q ≥ 0). With the layer
 * matrix M(d) = [[cos δ, −i sin δ/η], [−i η sin δ, cos δ]], δ = k0·q·d (Macleod, Thin-Film Optical
 * Filters, ch. 2), dM/dd = G·M = M·G with
 *
 *   G = −i k0 [[0, a], [b, 0]],   s: a = 1, b = ε − β²;   p: a = (ε − β²)/ε, b = ε,
 *
 * so with P_j = M_1⋯M_{j−1} and v_j = M_j⋯M_L [1; η_exit], ∂[B; C]/∂d_j = P_j·G_j·v_j. A needle of
 * material m at depth z changes [B; C] by Δ·P(z)·G_m·v(z) to first order in its thickness Δ
 * (A. V. Tikhonravov, M. K. Trubetskov, G. W. DeBell, Appl. Opt. 35, 5493 (1996)). From
 * r = (η₀B − C)/(η₀B + C) and t = 2η₀/(η₀B + C):
 *
 *   dr = 2η₀(C dB − B dC)/D²,  dt = −2η₀(η₀ dB + dC)/D²,  D = η₀B + C,
 *   dR = 2 Re(r̄ dr),  dT = 2 Re(η_exit)/Re(η₀) · Re(t̄ dt).
 *
 * The products are not rescaled: stacks whose total decay Σ k0·d·Im q exceeds about 300 (opaque
 * metal, a long tunnelling gap) overflow here and must use differences of computeSpectrum instead.
 */
import { OpticsInputError } from './errors.js';
import type { SpectrumPlan } from './batch.js';
import { sinCos } from './fastmath.js';
import { forwardRoot } from './matrix.js';

const TRIG = new Float64Array(2);
const ROOT = new Float64Array(2);

/** ∂R/∂d and ∂T/∂d per front layer, nm⁻¹: [l·plan.size + spectrumIndex]. */
export interface ThicknessDerivatives {
  dR: Float64Array;
  /** Empty when the derivatives were made without T ({@link DerivativeOptions.wantT} false). */
  dT: Float64Array;
}

/** What {@link computeThicknessDerivatives} computes; by default everything. */
export interface DerivativeOptions {
  /** ∂T/∂d as well as ∂R/∂d (default true). Without it `dT` is neither needed nor written. */
  wantT?: boolean;
  /**
   * Spectrum indices wanted (1) or not (0), length plan.size; the entries of other indices are
   * left as they were, and a (wavelength, angle) with no wanted index is not swept at all.
   * Default: every index.
   */
  points?: Uint8Array | null;
}

/** Materials a needle may be made of, on the plan's wavelengths: ε = N², [m·nWavelengths + iWl]. */
export interface NeedleMaterials {
  count: number;
  epsRe: Float64Array;
  epsIm: Float64Array;
}

/**
 * Depth grid of a needle scan: per point its layer and offset below that layer's front, nm. Layer
 * j is cut into `steps[j]` equal parts; its points are k = 1…steps[j] (k = 0 too for the front
 * layer), so an interface appears once, as the far end of the layer above it.
 */
export interface NeedleGrid {
  count: number;
  layer: Int32Array;
  offsetNm: Float64Array;
  steps: Int32Array;
}

/** Per-layer scratch of one (wavelength, angle): cos δ, sin δ, q², ε, and the sweeps' vectors. */
interface Scratch {
  cr: Float64Array;
  ci: Float64Array;
  sr: Float64Array;
  si: Float64Array;
  q2r: Float64Array;
  q2i: Float64Array;
  qr: Float64Array;
  qi: Float64Array;
  /** η per layer for the polarisation being swept. */
  er: Float64Array;
  ei: Float64Array;
  /** Off-diagonal matrix elements u = −i sin δ/η and g = −i η sin δ, same polarisation. */
  ur: Float64Array;
  ui: Float64Array;
  gr: Float64Array;
  gi: Float64Array;
  /** a and b of G = −i k0 [[0, a], [b, 0]], same polarisation. */
  ar: Float64Array;
  ai: Float64Array;
  br: Float64Array;
  bi: Float64Array;
  /** v_j = [B_j; C_j], j = 0…L (v_L = [1; η_exit]). */
  vBr: Float64Array;
  vBi: Float64Array;
  vCr: Float64Array;
  vCi: Float64Array;
  /** Per-point v(z) inside one layer. */
  pBr: Float64Array;
  pBi: Float64Array;
  pCr: Float64Array;
  pCi: Float64Array;
}

const scratchOf = new WeakMap<SpectrumPlan, Scratch>();

function scratch(plan: SpectrumPlan, points: number): Scratch {
  const L = plan.work.layerCount;
  let s = scratchOf.get(plan);
  if (!s || s.pBr.length < points) {
    const f = (n: number) => new Float64Array(n);
    s = {
      cr: f(L),
      ci: f(L),
      sr: f(L),
      si: f(L),
      q2r: f(L),
      q2i: f(L),
      qr: f(L),
      qi: f(L),
      er: f(L),
      ei: f(L),
      ur: f(L),
      ui: f(L),
      gr: f(L),
      gi: f(L),
      ar: f(L),
      ai: f(L),
      br: f(L),
      bi: f(L),
      vBr: f(L + 1),
      vBi: f(L + 1),
      vCr: f(L + 1),
      vCi: f(L + 1),
      pBr: f(Math.max(points, 1)),
      pBi: f(Math.max(points, 1)),
      pCr: f(Math.max(points, 1)),
      pCi: f(Math.max(points, 1)),
    };
    scratchOf.set(plan, s);
  }
  return s;
}

function checkPlan(plan: SpectrumPlan): void {
  if (plan.back !== 'none') {
    throw new OpticsInputError(
      'back',
      'analytic derivatives exist for the coherent front surface (back "none") only',
    );
  }
}

/** Allocates derivative arrays for `plan` (`dT` empty when `wantT` is false). */
export function createThicknessDerivatives(
  plan: SpectrumPlan,
  options: Pick<DerivativeOptions, 'wantT'> = {},
): ThicknessDerivatives {
  checkPlan(plan);
  const n = plan.size * plan.work.layerCount;
  return { dR: new Float64Array(n), dT: new Float64Array(options.wantT === false ? 0 : n) };
}

/**
 * cos δ, sin δ and q² of every front layer at wavelength `iw` and Snell invariant β (β² given).
 * q² = ε − β² exactly; q on the forward branch as in matrix.ts.
 */
function layerTrig(plan: SpectrumPlan, s: Scratch, iw: number, k0: number, beta2: number): void {
  const w = plan.work;
  const L = w.layerCount;
  for (let l = 0; l < L; l++) {
    const er = w.frontEpsRe[iw * L + l];
    const ei = w.frontEpsIm[iw * L + l];
    const x = er - beta2;
    forwardRoot(ROOT, x, ei);
    const qr = ROOT[0];
    const qi = ROOT[1];
    const kd = k0 * w.frontThicknessNm[l];
    const a = kd * qr;
    const b = kd * qi;
    sinCos(TRIG, 0, a);
    const sa = TRIG[0];
    const ca = TRIG[1];
    const ch = b === 0 ? 1 : Math.cosh(b);
    const sh = b === 0 ? 0 : Math.sinh(b);
    s.cr[l] = ca * ch;
    s.ci[l] = -sa * sh;
    s.sr[l] = sa * ch;
    s.si[l] = ca * sh;
    s.q2r[l] = x;
    s.q2i[l] = ei;
    s.qr[l] = qr;
    s.qi[l] = qi;
  }
}

/** Output of {@link admittance}: η of a medium at [o], [o + 1]. */
const ETA = new Float64Array(4);

/**
 * Per layer, for s or p: the tilted admittance η (η_s = q, η_p = ε/q), the matrix's off-diagonal
 * elements and a, b of G. Needs {@link layerTrig} of the same wavelength and angle first.
 */
function admittances(plan: SpectrumPlan, s: Scratch, iw: number, p: boolean): void {
  const w = plan.work;
  const L = w.layerCount;
  for (let l = 0; l < L; l++) {
    const epr = w.frontEpsRe[iw * L + l];
    const epi = w.frontEpsIm[iw * L + l];
    // η_s = q, η_p = ε/q, with q from layerTrig.
    const qr = s.qr[l];
    const qi = s.qi[l];
    let er = qr;
    let ei = qi;
    if (p) {
      const q2 = qr * qr + qi * qi;
      er = (epr * qr + epi * qi) / q2;
      ei = (epi * qr - epr * qi) / q2;
    }
    s.er[l] = er;
    s.ei[l] = ei;
    const sr = s.sr[l];
    const si = s.si[l];
    // u = −i sin δ/η, g = −i η sin δ
    const e2 = er * er + ei * ei;
    s.ur[l] = (si * er - sr * ei) / e2;
    s.ui[l] = -(sr * er + si * ei) / e2;
    s.gr[l] = er * si + ei * sr;
    s.gi[l] = -(er * sr - ei * si);
    if (p) {
      const xr = s.q2r[l];
      const xi = s.q2i[l];
      const m2 = epr * epr + epi * epi;
      s.ar[l] = (xr * epr + xi * epi) / m2;
      s.ai[l] = (xi * epr - xr * epi) / m2;
      s.br[l] = epr;
      s.bi[l] = epi;
    } else {
      s.ar[l] = 1;
      s.ai[l] = 0;
      s.br[l] = s.q2r[l];
      s.bi[l] = s.q2i[l];
    }
  }
}

/** η of a medium into ETA[o], ETA[o + 1]. */
function admittance(er: number, ei: number, beta2: number, p: boolean, o: number): void {
  forwardRoot(ROOT, er - beta2, ei);
  const qr = ROOT[0];
  const qi = ROOT[1];
  if (!p) {
    ETA[o] = qr;
    ETA[o + 1] = qi;
    return;
  }
  const q2 = qr * qr + qi * qi;
  ETA[o] = (er * qr + ei * qi) / q2;
  ETA[o + 1] = (ei * qr - er * qi) / q2;
}

/** Backward sweep: v_j = M_j v_{j+1} from v_L = [1; η_exit]. */
function backwardSweep(s: Scratch, L: number, etaExitRe: number, etaExitIm: number): void {
  s.vBr[L] = 1;
  s.vBi[L] = 0;
  s.vCr[L] = etaExitRe;
  s.vCi[L] = etaExitIm;
  for (let l = L - 1; l >= 0; l--) {
    matrixTimesVector(
      s.vBr,
      s.vBi,
      s.vCr,
      s.vCi,
      l,
      l + 1,
      s.cr[l],
      s.ci[l],
      s.ur[l],
      s.ui[l],
      s.gr[l],
      s.gi[l],
    );
  }
}

/**
 * Everything before a forward sweep, for one polarisation: the layers' admittances and matrices,
 * the backward sweep v_j and the surface coefficients COEF.
 */
function backwardPass(plan: SpectrumPlan, s: Scratch, iw: number, beta2: number, p: boolean): void {
  const w = plan.work;
  admittances(plan, s, iw, p);
  admittance(w.subEpsRe[iw], w.subEpsIm[iw], beta2, p, 0);
  const exitRe = ETA[0];
  backwardSweep(s, w.layerCount, ETA[0], ETA[1]);
  const n0 = w.incN[iw];
  admittance(n0 * n0, 0, beta2, p, 2);
  surfaceCoefficients(s, ETA[2], ETA[3], exitRe);
}

/** Output of {@link surfaceCoefficients}: the complex factors turning [dB; dC] into dR and dT. */
const COEF = new Float64Array(8);

/**
 * From η₀ and v_0 = [B; C]: COEF[0..1] = (C·κ), COEF[2..3] = (−B·κ) with κ = 2η₀ r̄/D², so that
 * dR = 2 Re(COEF_0 dB + COEF_1 dC); COEF[4..7] likewise for dT (κ_t = −2η₀ t̄/D² · Re η_m/Re η₀,
 * rows η₀ and 1). All derivatives of R and T are then real parts of these rows times [dB; dC].
 */
function surfaceCoefficients(s: Scratch, e0r: number, e0i: number, etaExitRe: number): void {
  const Br = s.vBr[0];
  const Bi = s.vBi[0];
  const Cr = s.vCr[0];
  const Ci = s.vCi[0];
  const Dr = e0r * Br - e0i * Bi + Cr;
  const Di = e0r * Bi + e0i * Br + Ci;
  const Nr = e0r * Br - e0i * Bi - Cr;
  const Ni = e0r * Bi + e0i * Br - Ci;
  const d2 = Dr * Dr + Di * Di;
  // r = N/D, t = 2η₀/D
  const rr = (Nr * Dr + Ni * Di) / d2;
  const ri = (Ni * Dr - Nr * Di) / d2;
  const tr = (2 * (e0r * Dr + e0i * Di)) / d2;
  const ti = (2 * (e0i * Dr - e0r * Di)) / d2;
  // 1/D² = conj(D)²/|D|⁴
  const iDr = (Dr * Dr - Di * Di) / (d2 * d2);
  const iDi = (-2 * Dr * Di) / (d2 * d2);
  // w = 2η₀/D²
  const wr = 2 * (e0r * iDr - e0i * iDi);
  const wi = 2 * (e0r * iDi + e0i * iDr);
  // κ_r = r̄ w
  const kr = rr * wr + ri * wi;
  const ki = rr * wi - ri * wr;
  COEF[0] = kr * Cr - ki * Ci;
  COEF[1] = kr * Ci + ki * Cr;
  COEF[2] = -(kr * Br - ki * Bi);
  COEF[3] = -(kr * Bi + ki * Br);
  // κ_t = −t̄ w · Re η_m/Re η₀
  const f = e0r > 0 ? -etaExitRe / e0r : 0;
  const tkr = f * (tr * wr + ti * wi);
  const tki = f * (tr * wi - ti * wr);
  COEF[4] = tkr * e0r - tki * e0i;
  COEF[5] = tkr * e0i + tki * e0r;
  COEF[6] = tkr;
  COEF[7] = tki;
}

/**
 * ∂R/∂d and ∂T/∂d of every front layer (nm⁻¹) on the plan's grid into `out` (from
 * {@link createThicknessDerivatives}), laid out [l·plan.size + spectrumIndex]; `avg` gets the mean
 * of s and p. `options` leaves out T or spectrum indices whose derivatives are not used. See the
 * file comment for the method. Allocates nothing after the first call on a plan.
 */
export function computeThicknessDerivatives(
  out: ThicknessDerivatives,
  plan: SpectrumPlan,
  options: DerivativeOptions = {},
): ThicknessDerivatives {
  checkPlan(plan);
  const w = plan.work;
  const L = w.layerCount;
  const size = plan.size;
  const wantT = options.wantT !== false;
  const points = options.points ?? null;
  if (out.dR.length < L * size || (wantT && out.dT.length < L * size)) {
    throw new OpticsInputError('out', `derivative arrays must hold ${L * size} values`);
  }
  if (points && points.length < size) {
    throw new OpticsInputError('points', `must hold ${size} flags (got ${points.length})`);
  }
  const s = scratch(plan, 1);
  const nW = plan.wavelengthsNm.length;
  const nA = plan.anglesDeg.length;
  const pols = plan.polarisations;
  const nP = pols.length;
  for (let iw = 0; iw < nW; iw++) {
    const k0 = w.k0[iw];
    const n0 = w.incN[iw];
    for (let ia = 0; ia < nA; ia++) {
      if (points) {
        let any = 0;
        for (let ip = 0; ip < nP; ip++) any |= points[(ip * nA + ia) * nW + iw];
        if (any === 0) continue;
      }
      const beta = n0 * w.sinAngles[ia];
      const beta2 = beta * beta;
      layerTrig(plan, s, iw, k0, beta2);
      for (let ip = 0; ip < nP; ip++) {
        const idx = (ip * nA + ia) * nW + iw;
        if (points && points[idx] === 0) continue;
        for (let l = 0; l < L; l++) out.dR[l * size + idx] = 0;
        if (wantT) for (let l = 0; l < L; l++) out.dT[l * size + idx] = 0;
        const pol = pols[ip];
        const weight = pol === 'avg' ? 0.5 : 1;
        if (pol !== 'p') sweepLayers(out, plan, s, iw, k0, beta2, false, idx, weight, wantT);
        if (pol !== 's') sweepLayers(out, plan, s, iw, k0, beta2, true, idx, weight, wantT);
      }
    }
  }
  return out;
}

/** One polarisation's sweeps; adds weight·∂R/∂d_l (and weight·∂T/∂d_l with wantT) at idx. */
function sweepLayers(
  out: ThicknessDerivatives,
  plan: SpectrumPlan,
  s: Scratch,
  iw: number,
  k0: number,
  beta2: number,
  p: boolean,
  idx: number,
  weight: number,
  wantT: boolean,
): void {
  const w = plan.work;
  const L = w.layerCount;
  const size = plan.size;
  backwardPass(plan, s, iw, beta2, p);
  // Without T the second row is neither used nor carried (a third of the sweep's work).
  if (!wantT) {
    sweepReflectance(out.dR, s, L, size, k0, idx, weight);
    return;
  }
  // Rows ℓ_R = (COEF[0…1], COEF[2…3])·P_j and ℓ_T = (COEF[4…5], COEF[6…7])·P_j, carried forward.
  ROW.set(COEF);
  for (let l = 0; l < L; l++) {
    // G v = −i k0 [a C; b B]
    const ar = s.ar[l];
    const ai = s.ai[l];
    const br = s.br[l];
    const bi = s.bi[l];
    const Br = s.vBr[l];
    const Bi = s.vBi[l];
    const Cr = s.vCr[l];
    const Ci = s.vCi[l];
    // g1 = a C, g2 = b B, then times −i k0: (x + iy)(−i k0) = (k0 y, −k0 x)
    const a1r = ar * Cr - ai * Ci;
    const a1i = ar * Ci + ai * Cr;
    const b1r = br * Br - bi * Bi;
    const b1i = br * Bi + bi * Br;
    const g1r = k0 * a1i;
    const g1i = -k0 * a1r;
    const g2r = k0 * b1i;
    const g2i = -k0 * b1r;
    const dR = 2 * (ROW[0] * g1r - ROW[1] * g1i + ROW[2] * g2r - ROW[3] * g2i);
    out.dR[l * size + idx] += weight * dR;
    rowTimesLayer(ROW, 0, s, l);
    const dT = 2 * (ROW[4] * g1r - ROW[5] * g1i + ROW[6] * g2r - ROW[7] * g2i);
    out.dT[l * size + idx] += weight * dT;
    rowTimesLayer(ROW, 4, s, l);
  }
}

/**
 * The forward sweep of {@link sweepLayers} for ∂R/∂d alone, with the row ℓ_R in locals (faster
 * than through ROW): adds weight·∂R/∂d_l at idx, by the same arithmetic as the full sweep.
 */
function sweepReflectance(
  dR: Float64Array,
  s: Scratch,
  L: number,
  size: number,
  k0: number,
  idx: number,
  weight: number,
): void {
  let x1r = COEF[0];
  let x1i = COEF[1];
  let x2r = COEF[2];
  let x2i = COEF[3];
  for (let l = 0; l < L; l++) {
    // ℓ_R·G v with G v = −i k0 [a C; b B] (as in sweepLayers)
    const aCi = complexProduct(s.ar[l], s.ai[l], s.vCr[l], s.vCi[l]);
    const aCr = PRODUCT[0];
    const bBi = complexProduct(s.br[l], s.bi[l], s.vBr[l], s.vBi[l]);
    const bBr = PRODUCT[0];
    const g1r = k0 * aCi;
    const g1i = -k0 * aCr;
    const g2r = k0 * bBi;
    const g2i = -k0 * bBr;
    dR[l * size + idx] += weight * (2 * (x1r * g1r - x1i * g1i + x2r * g2r - x2i * g2i));
    // ℓ_R ← ℓ_R·M_l, M = [[c, u], [g, c]]
    const cr = s.cr[l];
    const ci = s.ci[l];
    const ur = s.ur[l];
    const ui = s.ui[l];
    const gr = s.gr[l];
    const gi = s.gi[l];
    const y1r = x1r * cr - x1i * ci + x2r * gr - x2i * gi;
    const y1i = x1r * ci + x1i * cr + x2r * gi + x2i * gr;
    const y2r = x1r * ur - x1i * ui + x2r * cr - x2i * ci;
    const y2i = x1r * ui + x1i * ur + x2r * ci + x2i * cr;
    x1r = y1r;
    x1i = y1i;
    x2r = y2r;
    x2i = y2i;
  }
}

/** Real part of the last {@link complexProduct}. */
const PRODUCT = new Float64Array(1);

/** (xr + i xi)(yr + i yi): the real part into PRODUCT[0], the imaginary part returned. */
function complexProduct(xr: number, xi: number, yr: number, yi: number): number {
  PRODUCT[0] = xr * yr - xi * yi;
  return xr * yi + xi * yr;
}

/** Rows of the forward sweep: ℓ_R at 0…3 and ℓ_T at 4…7 (re, im of each element). */
const ROW = new Float64Array(8);

/** row[o…o+3] ← row·M_l: (x1, x2)·[[c, u], [g, c]] = (x1 c + x2 g, x1 u + x2 c). */
function rowTimesLayer(row: Float64Array, o: number, s: Scratch, l: number): void {
  rowTimesMatrix(row, o, s.cr[l], s.ci[l], s.ur[l], s.ui[l], s.gr[l], s.gi[l]);
}

function rowTimesMatrix(
  row: Float64Array,
  o: number,
  cr: number,
  ci: number,
  ur: number,
  ui: number,
  gr: number,
  gi: number,
): void {
  const x1r = row[o];
  const x1i = row[o + 1];
  const x2r = row[o + 2];
  const x2i = row[o + 3];
  row[o] = x1r * cr - x1i * ci + x2r * gr - x2i * gi;
  row[o + 1] = x1r * ci + x1i * cr + x2r * gi + x2i * gr;
  row[o + 2] = x1r * ur - x1i * ui + x2r * cr - x2i * ci;
  row[o + 3] = x1r * ui + x1i * ur + x2r * ci + x2i * cr;
}

/**
 * [B; C] at index `to` ← M·[B; C] at index `from`, M = [[c, u], [g, c]], in four parallel arrays.
 */
function matrixTimesVector(
  Br: Float64Array,
  Bi: Float64Array,
  Cr: Float64Array,
  Ci: Float64Array,
  to: number,
  from: number,
  cr: number,
  ci: number,
  ur: number,
  ui: number,
  gr: number,
  gi: number,
): void {
  const br = Br[from];
  const bi = Bi[from];
  const cR = Cr[from];
  const cI = Ci[from];
  Br[to] = cr * br - ci * bi + ur * cR - ui * cI;
  Bi[to] = cr * bi + ci * br + ur * cI + ui * cR;
  Cr[to] = gr * br - gi * bi + cr * cR - ci * cI;
  Ci[to] = gr * bi + gi * br + cr * cI + ci * cR;
}

/**
 * The needle scan's depth grid for front layers of the given thicknesses (nm): points at most
 * `stepNm` apart through every layer, the front surface and every interface included. With no
 * layers, the one point is the substrate's surface.
 */
export function createNeedleGrid(thicknessesNm: ArrayLike<number>, stepNm: number): NeedleGrid {
  if (!(stepNm > 0) || !Number.isFinite(stepNm)) {
    throw new OpticsInputError('positionStepNm', `must be a positive number (got ${stepNm})`);
  }
  const L = thicknessesNm.length;
  const steps = new Int32Array(L);
  let count = L === 0 ? 1 : 1;
  for (let j = 0; j < L; j++) {
    steps[j] = Math.max(1, Math.ceil(thicknessesNm[j] / stepNm));
    count += steps[j];
  }
  const layer = new Int32Array(count);
  const offsetNm = new Float64Array(count);
  let i = 1;
  for (let j = 0; j < L; j++) {
    for (let k = 1; k <= steps[j]; k++) {
      layer[i] = j;
      offsetNm[i] = Math.min(thicknessesNm[j], (thicknessesNm[j] * k) / steps[j]);
      i++;
    }
  }
  return { count, layer, offsetNm, steps };
}

/** Scratch of the needle scan: a and b of G per material. */
const needleScratch = {
  ar: new Float64Array(8),
  ai: new Float64Array(8),
  br: new Float64Array(8),
  bi: new Float64Array(8),
};

/**
 * The needle function: ∂F/∂Δ for a needle of thickness Δ of each material at each point of
 * `grid`, with F = Σ_i gR[i]·R_i + gT[i]·T_i over the plan's spectrum (weights per spectrum
 * index, e.g. MaskMerit.gradientWeights, so ∂F/∂Δ is the merit's first-order change), into
 * out[m·grid.count + point] (nm⁻¹ times F's unit). Negative values mark where a needle lowers F.
 * The grid must come from {@link createNeedleGrid} for the plan's current thicknesses. One forward
 * and one backward sweep per wavelength, angle and polarisation serve every point and material.
 */
export function needleFunction(
  out: Float64Array,
  plan: SpectrumPlan,
  materials: NeedleMaterials,
  grid: NeedleGrid,
  gR: Float64Array,
  gT: Float64Array,
): Float64Array {
  checkPlan(plan);
  const w = plan.work;
  const L = w.layerCount;
  const nM = materials.count;
  const nW = plan.wavelengthsNm.length;
  const nA = plan.anglesDeg.length;
  if (grid.steps.length !== L)
    throw new OpticsInputError('grid', `needs ${L} layers (got ${grid.steps.length})`);
  if (out.length < nM * grid.count) throw new OpticsInputError('out', `must hold ${nM * grid.count} values`);
  if (materials.epsRe.length < nM * nW || materials.epsIm.length < nM * nW) {
    throw new OpticsInputError('materials', `need ${nM * nW} permittivities`);
  }
  if (needleScratch.ar.length < nM) {
    needleScratch.ar = new Float64Array(nM);
    needleScratch.ai = new Float64Array(nM);
    needleScratch.br = new Float64Array(nM);
    needleScratch.bi = new Float64Array(nM);
  }
  let most = 1;
  for (let j = 0; j < L; j++) most = Math.max(most, grid.steps[j] + 1);
  const s = scratch(plan, most);
  out.fill(0, 0, nM * grid.count);
  const pols = plan.polarisations;
  for (let iw = 0; iw < nW; iw++) {
    const k0 = w.k0[iw];
    const n0 = w.incN[iw];
    for (let ia = 0; ia < nA; ia++) {
      const beta2 = (n0 * w.sinAngles[ia]) ** 2;
      // Weights of s and p at this (wavelength, angle); avg counts half for each.
      let wRs = 0;
      let wTs = 0;
      let wRp = 0;
      let wTp = 0;
      for (let ip = 0; ip < pols.length; ip++) {
        const idx = (ip * nA + ia) * nW + iw;
        const f = pols[ip] === 'avg' ? 0.5 : 1;
        if (pols[ip] !== 'p') {
          wRs += f * gR[idx];
          wTs += f * gT[idx];
        }
        if (pols[ip] !== 's') {
          wRp += f * gR[idx];
          wTp += f * gT[idx];
        }
      }
      if (wRs === 0 && wTs === 0 && wRp === 0 && wTp === 0) continue;
      layerTrig(plan, s, iw, k0, beta2);
      if (wRs !== 0 || wTs !== 0) needleSweep(out, plan, materials, grid, s, iw, k0, beta2, false, wRs, wTs);
      if (wRp !== 0 || wTp !== 0) needleSweep(out, plan, materials, grid, s, iw, k0, beta2, true, wRp, wTp);
    }
  }
  return out;
}

/** One polarisation of {@link needleFunction}: adds its contribution at every point and material. */
function needleSweep(
  out: Float64Array,
  plan: SpectrumPlan,
  materials: NeedleMaterials,
  grid: NeedleGrid,
  s: Scratch,
  iw: number,
  k0: number,
  beta2: number,
  p: boolean,
  wR: number,
  wT: number,
): void {
  const w = plan.work;
  const L = w.layerCount;
  const nM = materials.count;
  const nW = plan.wavelengthsNm.length;
  const G = grid.count;
  const { ar, ai, br, bi } = needleScratch;
  for (let m = 0; m < nM; m++) {
    const er = materials.epsRe[m * nW + iw];
    const ei = materials.epsIm[m * nW + iw];
    if (p) {
      const e2 = er * er + ei * ei;
      const xr = er - beta2;
      ar[m] = (xr * er + ei * ei) / e2;
      ai[m] = (ei * er - xr * ei) / e2;
      br[m] = er;
      bi[m] = ei;
    } else {
      ar[m] = 1;
      ai[m] = 0;
      br[m] = er - beta2;
      bi[m] = ei;
    }
  }
  backwardPass(plan, s, iw, beta2, p);
  // One row ℓ = wR·ℓ_R + wT·ℓ_T: the merit is linear in R and T, so one row carries both.
  // ROW[0…3] holds ℓ at the layer's front, ROW[4…7] ℓ stepped through the layer.
  for (let i = 0; i < 4; i++) ROW[i] = wR * COEF[i] + wT * COEF[i + 4];
  addNeedlePoint(out, G, nM, 0, k0, s.vBr[0], s.vBi[0], s.vCr[0], s.vCi[0]);
  let point = 1;
  for (let j = 0; j < L; j++) {
    const n = grid.steps[j];
    // Step matrix M_j(h), h = d/n: cos, and the off-diagonal elements u = −i sin/η, g = −i η sin.
    const kh = (k0 * w.frontThicknessNm[j]) / n;
    const a = kh * s.qr[j];
    const b = kh * s.qi[j];
    const ca = Math.cos(a);
    const sa = Math.sin(a);
    const ch = Math.cosh(b);
    const sh = Math.sinh(b);
    const cr = ca * ch;
    const ci = -sa * sh;
    const sr = sa * ch;
    const si = ca * sh;
    const er = s.er[j];
    const ei = s.ei[j];
    const e2 = er * er + ei * ei;
    const ur = (si * er - sr * ei) / e2;
    const ui = -(sr * er + si * ei) / e2;
    const gr = er * si + ei * sr;
    const gi = -(er * sr - ei * si);
    // v at the layer's points k = n…0 (k = n is the layer's back, v_{j+1}).
    s.pBr[n] = s.vBr[j + 1];
    s.pBi[n] = s.vBi[j + 1];
    s.pCr[n] = s.vCr[j + 1];
    s.pCi[n] = s.vCi[j + 1];
    for (let k = n - 1; k >= 1; k--) {
      matrixTimesVector(s.pBr, s.pBi, s.pCr, s.pCi, k, k + 1, cr, ci, ur, ui, gr, gi);
    }
    // ℓ through the layer by the same steps.
    for (let i = 0; i < 4; i++) ROW[4 + i] = ROW[i];
    for (let k = 1; k < n; k++) {
      rowTimesMatrix(ROW, 4, cr, ci, ur, ui, gr, gi);
      addNeedlePoint(out, G, nM, point, k0, s.pBr[k], s.pBi[k], s.pCr[k], s.pCi[k], 4);
      point++;
    }
    // ℓ_{j+1} = ℓ_j·M_j with the layer's whole matrix (no accumulated stepping error at interfaces).
    rowTimesLayer(ROW, 0, s, j);
    addNeedlePoint(out, G, nM, point, k0, s.vBr[j + 1], s.vBi[j + 1], s.vCr[j + 1], s.vCi[j + 1]);
    point++;
  }
}

/**
 * Adds one point's needle derivative for every material, with ℓ = ROW[row…row+3] and v = [B; C]:
 * with X = ℓ1·C and Y = ℓ2·B,
 * ∂F/∂Δ = 2 Re(−i k0 (a X + b Y)) = 2 k0 Im(a X + b Y).
 */
function addNeedlePoint(
  out: Float64Array,
  G: number,
  nM: number,
  point: number,
  k0: number,
  Br: number,
  Bi: number,
  Cr: number,
  Ci: number,
  row = 0,
): void {
  const x1r = ROW[row];
  const x1i = ROW[row + 1];
  const x2r = ROW[row + 2];
  const x2i = ROW[row + 3];
  const { ar, ai, br, bi } = needleScratch;
  const Xr = x1r * Cr - x1i * Ci;
  const Xi = x1r * Ci + x1i * Cr;
  const Yr = x2r * Br - x2i * Bi;
  const Yi = x2r * Bi + x2i * Br;
  for (let m = 0; m < nM; m++) {
    out[m * G + point] += 2 * k0 * (ar[m] * Xi + ai[m] * Xr + br[m] * Yi + bi[m] * Yr);
  }
}
