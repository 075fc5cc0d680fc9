/*
 * Limit bands as form values, and the engine's rules for them (validateSpecMask in
 * shared/src/optics/mask.ts, which the API applies): 0 < from_nm ≤ to_nm, angles 0 ≤ θ < 90°,
 * exactly one bound between 0 and 100 %, a tolerance > 0 with a target only, weight and step > 0.
 */
import {
  bandDesignRange,
  expandAngleRange,
  OpticsInputError,
  type LimitBand,
  type Polarisation,
  type SpecMaskKind,
} from '@quietglass/shared';
import type { FieldPath } from 'react-hook-form';
import { parseNumberInput, parseNumberList } from '../../lib/format';

export type BoundType = 'max' | 'min' | 'target';

export interface BandValues {
  fromNm: string;
  toNm: string;
  /** Angles as a list, or as a range from–to with a step (both ends included). */
  angleMode: 'list' | 'range';
  /** Comma list of angles of incidence, degrees. */
  angles: string;
  angleFrom: string;
  angleTo: string;
  angleStep: string;
  polarisation: Polarisation;
  quantity: 'R' | 'T';
  boundType: BoundType;
  /** The bound, percent. */
  value: string;
  tolerance: string;
  /** Design margin, percentage points inside the customer limit (empty: none). */
  margin: string;
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
  kind: SpecMaskKind;
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
  angleMode: 'list',
  angles: '0',
  angleFrom: '',
  angleTo: '',
  angleStep: '',
  polarisation: 'avg',
  quantity: 'R',
  boundType: 'max',
  value: '',
  tolerance: '',
  margin: '',
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
  angles: (v: string, band: BandValues): Verdict => {
    if (band.angleMode === 'range') return true;
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
  angleFrom: (v: string, band: BandValues): Verdict => {
    if (band.angleMode !== 'range') return true;
    const x = num(v);
    return (x !== null && x >= 0 && x < 90) || 'An angle from 0 to below 90°';
  },
  angleTo: (v: string, band: BandValues): Verdict => {
    if (band.angleMode !== 'range') return true;
    const x = num(v);
    if (x === null || !(x >= 0 && x < 90)) return 'An angle from 0 to below 90°';
    const from = num(band.angleFrom);
    return from === null || from <= x || `Must not be below From (${from}°)`;
  },
  /** The engine's own expansion decides how many angles a step gives. */
  angleStep: (v: string, band: BandValues): Verdict => {
    if (band.angleMode !== 'range') return true;
    const step = num(v);
    if (step === null || !(step > 0)) return 'A step greater than 0°';
    const from = num(band.angleFrom);
    const to = num(band.angleTo);
    if (from === null || to === null || from > to) return true;
    try {
      expandAngleRange({ from, to, step });
      return true;
    } catch (err) {
      if (err instanceof OpticsInputError) return `Too fine: ${err.problem}`;
      throw err;
    }
  },
  /** A margin ≥ 0 that leaves a design target inside 0–100 % (and a tolerance). */
  margin: (v: string, band: BandValues): Verdict => {
    if (v.trim() === '') return true;
    const m = num(v);
    if (m === null || m < 0) return 'Percentage points, 0 or more, or empty';
    const value = num(band.value);
    if (value === null) return true;
    const [low, high] = bandDesignRange({ ...boundOf(band, value), margin_percent: m });
    if (band.boundType === 'target' && !(low < high)) return 'Must be less than the tolerance';
    return (low <= 100 && high >= 0) || 'Leaves no design target inside 0–100 %';
  },
  stepNm: (v: string): Verdict =>
    v.trim() === '' || (num(v) ?? 0) > 0 || 'A step greater than 0 nm, or empty',
};

/** The band's wavelengths, quantity and bound alone. */
function boundOf(values: BandValues, value: number): LimitBand {
  const band: LimitBand = {
    from_nm: Number(num(values.fromNm)),
    to_nm: Number(num(values.toNm)),
    polarisation: values.polarisation,
    quantity: values.quantity,
  };
  if (values.boundType === 'max') band.max_percent = value;
  else if (values.boundType === 'min') band.min_percent = value;
  else {
    band.target_percent = value;
    band.tolerance_percent = Number(num(values.tolerance));
  }
  return band;
}

/** The band the API takes (only call with valid values). */
export function bandOf(values: BandValues): LimitBand {
  const band = boundOf(values, Number(num(values.value)));
  if (values.angleMode === 'range') {
    band.angle_from_deg = Number(num(values.angleFrom));
    band.angle_to_deg = Number(num(values.angleTo));
    band.angle_step_deg = Number(num(values.angleStep));
  } else {
    band.angles_deg = parseNumberList(values.angles) ?? [0];
  }
  if (values.margin.trim() !== '') band.margin_percent = Number(num(values.margin));
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
        bandRules.angles(b.angles, b) === true &&
        bandRules.angleFrom(b.angleFrom, b) === true &&
        bandRules.angleTo(b.angleTo, b) === true &&
        bandRules.angleStep(b.angleStep, b) === true &&
        bandRules.margin(b.margin, b) === true &&
        bandRules.value(b.value) === true &&
        bandRules.tolerance(b.tolerance, b) === true &&
        bandRules.stepNm(b.stepNm) === true,
    )
    .map((b) => {
      const band = bandOf(b);
      // The preview plot reads angles_deg: the range's angles, expanded as the engine does.
      if (band.angle_step_deg !== undefined)
        band.angles_deg = expandAngleRange({
          from: band.angle_from_deg ?? 0,
          to: band.angle_to_deg ?? 0,
          step: band.angle_step_deg,
        });
      return band;
    });
}

export function valuesOfBand(band: LimitBand): BandValues {
  const boundType: BoundType =
    band.max_percent !== undefined ? 'max' : band.min_percent !== undefined ? 'min' : 'target';
  const value = band.max_percent ?? band.min_percent ?? band.target_percent ?? 0;
  const ranged = band.angle_step_deg !== undefined;
  const text = (x: number | undefined) => (x === undefined ? '' : String(x));
  return {
    fromNm: String(band.from_nm),
    toNm: String(band.to_nm),
    angleMode: ranged ? 'range' : 'list',
    angles: (band.angles_deg ?? [0]).join(', '),
    angleFrom: text(band.angle_from_deg),
    angleTo: text(band.angle_to_deg),
    angleStep: text(band.angle_step_deg),
    margin: text(band.margin_percent),
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
  angle_from_deg: 'angleFrom',
  angle_to_deg: 'angleTo',
  angle_step_deg: 'angleStep',
  margin_percent: 'margin',
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
