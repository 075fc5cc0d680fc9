/*
 * Plain, readable transfer-matrix implementation with complex.js, kept beside the fast kernel
 * (matrix.ts) so tests can hold the two together. It follows the textbook form directly: build each
 * layer's characteristic matrix, multiply them, and read r, t, R, T and A off the product
 * (Macleod, Thin-Film Optical Filters, ch. 2, with the exp(−iωt) convention of matrix.ts:
 * N = n + ik, M = [[cos δ, −i sin δ/η], [−i η sin δ, cos δ]]). Not for hot paths: it allocates
 * a Complex per operation.
 */
import { Complex } from 'complex.js';

export interface ReferenceMedium {
  n: number;
  /** Extinction coefficient, ≥ 0 for loss. */
  k: number;
}

export interface ReferenceLayer extends ReferenceMedium {
  thicknessNm: number;
}

export interface ReferenceCase {
  /** Incident medium; must be lossless here. */
  incident: ReferenceMedium;
  /** Layers from the incident side to the exit medium. */
  layers: readonly ReferenceLayer[];
  exit: ReferenceMedium;
  wavelengthNm: number;
  angleDeg: number;
  polarisation: 's' | 'p';
}

export interface ReferenceResult {
  R: number;
  T: number;
  /** Absorptance from the net power flow into the stack, 4η₀ Re(BC* − η_exit)/|η₀B + C|². */
  A: number;
  r: Complex;
  t: Complex;
}

type Matrix = [[Complex, Complex], [Complex, Complex]];

const I = new Complex(0, 1);

/** N cos θ inside a medium, from Snell's invariant β = N₀ sin θ₀, on the forward branch. */
export function referenceNormalComponent(N: Complex, beta: number): Complex {
  const q = N.mul(N)
    .sub(beta * beta)
    .sqrt();
  // Forward-going or decaying wave: Im q ≥ 0, and Re q ≥ 0 when q is real.
  if (q.im < 0 || (q.im === 0 && q.re < 0)) return q.neg();
  return q;
}

/** Tilted admittance (units of the free-space admittance): η_s = N cos θ, η_p = N / cos θ. */
export function referenceAdmittance(N: Complex, q: Complex, polarisation: 's' | 'p'): Complex {
  return polarisation === 's' ? q : N.mul(N).div(q);
}

function multiply(a: Matrix, b: Matrix): Matrix {
  return [
    [a[0][0].mul(b[0][0]).add(a[0][1].mul(b[1][0])), a[0][0].mul(b[0][1]).add(a[0][1].mul(b[1][1]))],
    [a[1][0].mul(b[0][0]).add(a[1][1].mul(b[1][0])), a[1][0].mul(b[0][1]).add(a[1][1].mul(b[1][1]))],
  ];
}

/** Characteristic matrix of one layer. */
export function referenceLayerMatrix(
  layer: ReferenceLayer,
  beta: number,
  wavelengthNm: number,
  polarisation: 's' | 'p',
): Matrix {
  const N = new Complex(layer.n, layer.k);
  const q = referenceNormalComponent(N, beta);
  const eta = referenceAdmittance(N, q, polarisation);
  const delta = q.mul((2 * Math.PI * layer.thicknessNm) / wavelengthNm);
  const cos = delta.cos();
  const sin = delta.sin();
  return [
    [cos, I.neg().mul(sin).div(eta)],
    [I.neg().mul(eta).mul(sin), cos],
  ];
}

/** R, T, A, r and t of a stack by the characteristic-matrix method, written for clarity. */
export function referenceResponse(c: ReferenceCase): ReferenceResult {
  if (c.incident.k !== 0) throw new Error('reference implementation: the incident medium must be lossless');
  const N0 = new Complex(c.incident.n, 0);
  const beta = c.incident.n * Math.sin((c.angleDeg * Math.PI) / 180);
  const eta0 = referenceAdmittance(N0, referenceNormalComponent(N0, beta), c.polarisation);
  const Nm = new Complex(c.exit.n, c.exit.k);
  const etaM = referenceAdmittance(Nm, referenceNormalComponent(Nm, beta), c.polarisation);

  let M: Matrix = [
    [new Complex(1, 0), new Complex(0, 0)],
    [new Complex(0, 0), new Complex(1, 0)],
  ];
  for (const layer of c.layers)
    M = multiply(M, referenceLayerMatrix(layer, beta, c.wavelengthNm, c.polarisation));

  const B = M[0][0].add(M[0][1].mul(etaM));
  const C = M[1][0].add(M[1][1].mul(etaM));
  const denominator = eta0.mul(B).add(C);
  const r = eta0.mul(B).sub(C).div(denominator);
  const t = eta0.mul(2).div(denominator);
  const d2 = denominator.abs() ** 2;
  const R = r.abs() ** 2;
  const T = (4 * eta0.re * etaM.re) / d2;
  const A = (4 * eta0.re * B.mul(C.conjugate()).sub(etaM).re) / d2;
  return { R, T, A, r, t };
}
