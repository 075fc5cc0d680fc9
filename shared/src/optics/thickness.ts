/*
 * Layer thickness as physical thickness (nm) or in QWOT: optical thickness n·d in units of a quarter
 * of the reference wavelength, QWOT = 4·n(λ₀)·d/λ₀ (Macleod, ch. 2). n is the real part of the
 * layer's index at λ₀; QWOT refers to normal incidence.
 */
import { nonNegativeNumber, positiveNumber } from './checks.js';
import { indexAt, type MaterialModel } from './dispersion.js';

/**
 * Physical thickness in nm of a layer of `qwot` quarter waves at `referenceNm`.
 * d = QWOT·λ₀ / (4n). Throws OpticsInputError for negative or non-finite input.
 */
export function qwotToNm(qwot: number, n: number, referenceNm: number): number {
  nonNegativeNumber(qwot, 'qwot');
  positiveNumber(n, 'n');
  positiveNumber(referenceNm, 'reference_nm');
  return (qwot * referenceNm) / (4 * n);
}

/** QWOT at `referenceNm` of a layer `thicknessNm` thick with index n: 4·n·d/λ₀. */
export function nmToQwot(thicknessNm: number, n: number, referenceNm: number): number {
  nonNegativeNumber(thicknessNm, 'thickness_nm');
  positiveNumber(n, 'n');
  positiveNumber(referenceNm, 'reference_nm');
  return (4 * n * thicknessNm) / referenceNm;
}

/** {@link qwotToNm} with n taken from the material's dispersion at the reference wavelength. */
export function materialQwotToNm(material: MaterialModel, qwot: number, referenceNm: number): number {
  return qwotToNm(qwot, indexAt(material, referenceNm).n, referenceNm);
}

/** {@link nmToQwot} with n taken from the material's dispersion at the reference wavelength. */
export function materialNmToQwot(material: MaterialModel, thicknessNm: number, referenceNm: number): number {
  return nmToQwot(thicknessNm, indexAt(material, referenceNm).n, referenceNm);
}
