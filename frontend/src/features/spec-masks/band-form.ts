/*
 * Limit bands as form values, and the engine's rules for them (validateSpecMask in
 * shared/src/optics/mask.ts, which the API applies): 0 < from_nm ≤ to_nm, angles 0 ≤ θ < 90°,
 * exactly one bound between 0 and 100 %, a tolerance > 0 with a target only, weight and step > 0.
 */
import type { LimitBand, Polarisation } from '@quietglass/shared';
import type { FieldPath } from 'react-hook-form';
import { parseNumberInput, parseNumberList } from '../../lib/format';

export type BoundType = 'max' | 'min' | 'target';

export interface BandValues {
  fromNm: string;
  toNm: string;
  /** Comma list of angles of incidence, degrees. */
  angles: string;
  polarisation: Polarisation;
  quantity: 'R' | 'T';
  boundType: BoundType;
  /** The bound, percent. */
  value: string;
  tolerance: string;
  /** Sampling step inside the band, nm (the mask's default when empty). */
  stepNm: string;
  /** Kept as loaded: the form does not edit weights. */
  weight: string;
  label: string;
}

export interface MaskFormValues {
  name: string;
  customerId: string;
  revision: string;
  notes: string;
  bands: BandValues[];
}

export const BOUND_LABELS: Readonly<Record<BoundType, string>> = {
  max: 'Maximum',
  min: 'Minimum',
  target: 'Target ± tolerance',
};

export const EMPTY_BAND: BandValues = {
  fromNm: '',
  toNm: '',
  angles: '0',
  polarisation: 'avg',
  quantity: 'R',
  boundType: 'max',
  value: '',
  tolerance: '',
  stepNm: '',
  weight: '',
  label: '',
};

type Verdict = true | string;
const num = parseNumberInput;

export const bandRules = {
  fromNm: (v: string): Verdict => ((num(v) ?? 0) > 0 ? true : 'A wavelength greater than 0 nm'),
  toNm: (v: string, band: BandValues): Verdict => {
    const to = num(v);
    if (to === null || !(to > 0)) return 'A wavelength greater than 0 nm';
    const from = num(band.fromNm);
    return from === null || from <= to || `Must not be below From (${from} nm)`;
  },
  angles: (v: string): Verdict => {
    const list = parseNumberList(v);
    if (!list || list.length === 0) return 'A comma list of angles, e.g. 0, 15, 30';
    return list.every((a) => a >= 0 && a < 90) || 'Each angle from 0 to below 90°';
  },
  value: (v: string): Verdict => {
    const x = num(v);
    return (x !== null && x >= 0 && x <= 100) || 'A percentage from 0 to 100';
  },
  tolerance: (v: string, band: BandValues): Verdict => {
    if (band.boundType !== 'target') return true;
    return (num(v) ?? 0) > 0 || 'A tolerance greater than 0 %';
  },
  stepNm: (v: string): Verdict =>
    v.trim() === '' || (num(v) ?? 0) > 0 || 'A step greater than 0 nm, or empty',
};

/** The band the API takes (only call with valid values). */
export function bandOf(values: BandValues): LimitBand {
  const band: LimitBand = {
    from_nm: Number(num(values.fromNm)),
    to_nm: Number(num(values.toNm)),
    angles_deg: parseNumberList(values.angles) ?? [0],
    polarisation: values.polarisation,
    quantity: values.quantity,
  };
  const value = Number(num(values.value));
  if (values.boundType === 'max') band.max_percent = value;
  else if (values.boundType === 'min') band.min_percent = value;
  else {
    band.target_percent = value;
    band.tolerance_percent = Number(num(values.tolerance));
  }
  if (values.stepNm.trim() !== '') band.step_nm = Number(num(values.stepNm));
  if (values.weight.trim() !== '') band.weight = Number(num(values.weight));
  if (values.label.trim() !== '') band.label = values.label.trim();
  return band;
}

/** The bands of the form that are complete and valid, for a live preview plot. */
export function validBands(bands: readonly BandValues[]): LimitBand[] {
  return bands
    .filter(
      (b) =>
        bandRules.fromNm(b.fromNm) === true &&
        bandRules.toNm(b.toNm, b) === true &&
        bandRules.angles(b.angles) === true &&
        bandRules.value(b.value) === true &&
        bandRules.tolerance(b.tolerance, b) === true &&
        bandRules.stepNm(b.stepNm) === true,
    )
    .map(bandOf);
}

export function valuesOfBand(band: LimitBand): BandValues {
  const boundType: BoundType =
    band.max_percent !== undefined ? 'max' : band.min_percent !== undefined ? 'min' : 'target';
  const value = band.max_percent ?? band.min_percent ?? band.target_percent ?? 0;
  return {
    fromNm: String(band.from_nm),
    toNm: String(band.to_nm),
    angles: (band.angles_deg ?? [0]).join(', '),
    polarisation: band.polarisation ?? 'avg',
    quantity: band.quantity,
    boundType,
    value: String(value),
    tolerance: band.tolerance_percent === undefined ? '' : String(band.tolerance_percent),
    stepNm: band.step_nm === undefined ? '' : String(band.step_nm),
    weight: band.weight === undefined ? '' : String(band.weight),
    label: band.label ?? '',
  };
}

const FIELD_OF: Readonly<Record<string, keyof BandValues>> = {
  from_nm: 'fromNm',
  to_nm: 'toNm',
  angles_deg: 'angles',
  polarisation: 'polarisation',
  quantity: 'quantity',
  max_percent: 'value',
  min_percent: 'value',
  target_percent: 'value',
  tolerance_percent: 'tolerance',
  step_nm: 'stepNm',
  label: 'label',
};

export interface MappedError {
  /** The form field the message belongs to, or null for the band (or mask) as a whole. */
  path: FieldPath<MaskFormValues> | null;
  band: number | null;
  message: string;
}

/**
 * Where an API validation message belongs: `bands[1].to_nm: must …` goes to band 2's To field,
 * `bands[2]: contradicts …` to band 3 as a whole, anything else to the form.
 */
export function mapMaskError(detail: string): MappedError {
  const text = detail.replace(/^Invalid input:\s*/, '');
  const match = /^bands\[(\d+)\](?:\.([a-z_]+)(?:\[\d+\])?)?\s*:?\s*(.*)$/s.exec(text);
  if (!match) return { path: null, band: null, message: text };
  const band = Number(match[1]);
  const field = match[2] ? FIELD_OF[match[2]] : undefined;
  const message = match[3] || text;
  if (!field) return { path: null, band, message: match[2] ? `${match[2]}: ${message}` : message };
  return { path: `bands.${band}.${field}`, band, message };
}
