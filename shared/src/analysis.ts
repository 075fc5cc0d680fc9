/*
 * The full analysis of a design version, as the compute queue runs it: R, T and A over a
 * wavelength × angle grid for s, p and their average, reflected colour and Rv against angle, and
 * an optional field profile. Shared so the API, the worker and the client agree on the grid.
 */
import { finiteNumber, incidenceAngle, onlyKeys, plainObject, positiveNumber } from './optics/checks.js';
import { OpticsInputError } from './optics/errors.js';
import type { StackDescription } from './optics/stack.js';

/** Most wavelengths and angles one analysis may ask for. */
export const MAX_ANALYSIS_WAVELENGTHS = 4001;
export const MAX_ANALYSIS_ANGLES = 181;

/** Polarisations of every analysis, in this order in the result. */
export const ANALYSIS_POLARISATIONS = ['s', 'p', 'avg'] as const;
export type AnalysisQuantity = 'R' | 'T' | 'A';
export const ANALYSIS_QUANTITIES: readonly AnalysisQuantity[] = ['R', 'T', 'A'];

export interface AnalysisRequest {
  /** Wavelength range, nm, evenly sampled with `wavelengthCount` points (ends included). */
  fromNm: number;
  toNm: number;
  wavelengthCount: number;
  /** Angle range, degrees, evenly sampled with `angleCount` points (ends included). */
  angleFromDeg: number;
  angleToDeg: number;
  angleCount: number;
  /** Field profile at this wavelength (nm) and angle (degrees); none when omitted. */
  fieldWavelengthNm?: number;
  fieldAngleDeg?: number;
}

/** Everything the worker needs: the stack as the engine reads it, the grid, and the back surface. */
export interface AnalysisInput {
  stack: StackDescription;
  back: 'none' | 'incoherent';
  request: AnalysisRequest;
}

export interface AnalysisColour {
  angleDeg: number;
  L: number;
  a: number;
  b: number;
  x: number;
  y: number;
  /** Luminous reflectance (D65), fraction. */
  Rv: number;
}

export interface AnalysisField {
  wavelengthNm: number;
  angleDeg: number;
  depthsNm: number[];
  /** |E|² relative to the incident wave, s and p. */
  s: number[];
  p: number[];
  /** Depths of the layer interfaces, nm from the front of the first layer. */
  interfacesNm: number[];
  /** Each layer's name ("1 MgF2"), incident side first; absent in results stored before they were kept. */
  layerLabels?: string[];
}

/** The JSON part of a result; the R, T, A arrays are stored as binary beside it. */
export interface AnalysisSummary {
  wavelengthsNm: number[];
  anglesDeg: number[];
  polarisations: readonly ('s' | 'p' | 'avg')[];
  /** Colour and Rv of the reflected light at each analysed angle (unpolarised), or null when the
   * materials do not cover 380–780 nm. */
  colour: AnalysisColour[] | null;
  field: AnalysisField | null;
  warnings: string[];
}

/** Checks an analysis request; errors name the field. */
export function validateAnalysisRequest(input: unknown): AnalysisRequest {
  const obj = plainObject(input, '');
  onlyKeys(
    obj,
    [
      'fromNm',
      'toNm',
      'wavelengthCount',
      'angleFromDeg',
      'angleToDeg',
      'angleCount',
      'fieldWavelengthNm',
      'fieldAngleDeg',
    ],
    '',
  );
  const fromNm = positiveNumber(obj.fromNm, 'fromNm');
  const toNm = positiveNumber(obj.toNm, 'toNm');
  if (toNm <= fromNm) throw new OpticsInputError('toNm', `must exceed fromNm (${toNm} ≤ ${fromNm})`);
  const count = (v: unknown, field: string, max: number) => {
    const n = finiteNumber(v, field);
    if (!Number.isInteger(n) || n < 1 || n > max)
      throw new OpticsInputError(field, `must be a whole number from 1 to ${max}`);
    return n;
  };
  const wavelengthCount = count(obj.wavelengthCount, 'wavelengthCount', MAX_ANALYSIS_WAVELENGTHS);
  const angleFromDeg = incidenceAngle(obj.angleFromDeg, 'angleFromDeg');
  const angleToDeg = incidenceAngle(obj.angleToDeg, 'angleToDeg');
  if (angleToDeg < angleFromDeg) throw new OpticsInputError('angleToDeg', 'must not be below angleFromDeg');
  const angleCount = count(obj.angleCount, 'angleCount', MAX_ANALYSIS_ANGLES);
  const out: AnalysisRequest = { fromNm, toNm, wavelengthCount, angleFromDeg, angleToDeg, angleCount };
  if (obj.fieldWavelengthNm !== undefined) {
    out.fieldWavelengthNm = positiveNumber(obj.fieldWavelengthNm, 'fieldWavelengthNm');
    out.fieldAngleDeg =
      obj.fieldAngleDeg === undefined ? 0 : incidenceAngle(obj.fieldAngleDeg, 'fieldAngleDeg');
  } else if (obj.fieldAngleDeg !== undefined) {
    throw new OpticsInputError('fieldAngleDeg', 'needs fieldWavelengthNm');
  }
  return out;
}

/** `count` evenly spaced values from `from` to `to` (one value: `from`). */
export function evenlySpaced(from: number, to: number, count: number): Float64Array {
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) out[i] = count === 1 ? from : from + ((to - from) * i) / (count - 1);
  return out;
}

/** Index of a value in the binary result: quantity block, then the engine's spectrum order. */
export function analysisIndex(
  summary: Pick<AnalysisSummary, 'wavelengthsNm' | 'anglesDeg'>,
  quantity: AnalysisQuantity,
  polarisation: 's' | 'p' | 'avg',
  iAngle: number,
  iWavelength: number,
): number {
  const nW = summary.wavelengthsNm.length;
  const nA = summary.anglesDeg.length;
  const size = ANALYSIS_POLARISATIONS.length * nA * nW;
  return (
    ANALYSIS_QUANTITIES.indexOf(quantity) * size +
    (ANALYSIS_POLARISATIONS.indexOf(polarisation) * nA + iAngle) * nW +
    iWavelength
  );
}
