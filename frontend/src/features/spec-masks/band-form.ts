/*
 * Limit bands as form values, and the form's schema: the API's spec-mask schema, whose band rules
 * are the engine's (validateSpecMask in shared/src/optics/mask.ts), so the form shows the API's
 * messages on the fields they name.
 */
import {
  limitBandsSchema,
  specMaskInputSchema,
  type LimitBand,
  type Polarisation,
  type SpecMaskKind,
} from '@quietglass/shared';
import type { FieldPath } from 'react-hook-form';
import { z } from 'zod';
import { parseNumberInput, parseNumberList } from '../../lib/format';
import { chosenId } from '../../lib/validation';

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

const num = parseNumberInput;

/**
 * The band the API takes. A number field whose text is not a number becomes NaN (an angle list
 * [NaN]), which the form schema reports as a typing problem; empty optional fields are left out.
 */
export function bandOf(values: BandValues): LimitBand {
  const typed = (text: string) => num(text) ?? Number.NaN;
  const band: LimitBand = {
    from_nm: typed(values.fromNm),
    to_nm: typed(values.toNm),
    polarisation: values.polarisation,
    quantity: values.quantity,
  };
  const value = typed(values.value);
  if (values.boundType === 'max') band.max_percent = value;
  else if (values.boundType === 'min') band.min_percent = value;
  else {
    band.target_percent = value;
    band.tolerance_percent = typed(values.tolerance);
  }
  if (values.angleMode === 'range') {
    band.angle_from_deg = typed(values.angleFrom);
    band.angle_to_deg = typed(values.angleTo);
    band.angle_step_deg = typed(values.angleStep);
  } else {
    band.angles_deg = parseNumberList(values.angles) ?? [Number.NaN];
  }
  if (values.margin.trim() !== '') band.margin_percent = typed(values.margin);
  if (values.stepNm.trim() !== '') band.step_nm = typed(values.stepNm);
  if (values.weight.trim() !== '') band.weight = typed(values.weight);
  if (values.label.trim() !== '') band.label = values.label.trim();
  return band;
}

/** The form fields of a band whose text is not a number (or, for angles, not a list of numbers). */
function typingProblems(band: LimitBand): { field: keyof BandValues; message: string }[] {
  return Object.entries(band).flatMap(([key, value]) => {
    const field = FIELD_OF[key];
    const bad = Array.isArray(value) ? value.some(Number.isNaN) : Number.isNaN(value);
    if (!bad || !field) return [];
    return [
      {
        field,
        message:
          field === 'angles'
            ? 'Enter angles as numbers separated by commas, e.g. 0, 15, 30'
            : 'Enter a number',
      },
    ];
  });
}

/** The bands of the form that are complete and valid, as the engine normalised them (for the preview plot). */
export function validBands(bands: readonly BandValues[]): LimitBand[] {
  return bands.flatMap((values) => {
    const band = bandOf(values);
    if (typingProblems(band).length > 0) return [];
    const checked = limitBandsSchema.safeParse([band]);
    return checked.success ? checked.data : [];
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

interface BandPlace {
  /** The band, or null for the mask as a whole. */
  band: number | null;
  /** The band's form field, or null for the band as a whole. */
  field: keyof BandValues | null;
  message: string;
}

/**
 * Where a problem at a path below the mask's bands belongs: [1, 'to_nm'] is band 2's To field,
 * [2] (or a field the form does not show) band 3 as a whole, [] the mask.
 */
function placeOf(path: readonly PropertyKey[], message: string): BandPlace {
  const [band, key] = path;
  if (typeof band !== 'number') return { band: null, field: null, message };
  const field = typeof key === 'string' ? FIELD_OF[key] : undefined;
  if (field) return { band, field, message };
  return { band, field: null, message: typeof key === 'string' ? `${key}: ${message}` : message };
}

/**
 * Where an API validation message belongs: `bands.1.to_nm: must …` goes to band 2's To field,
 * `bands.2: … contradicts …` to band 3 as a whole, anything else to the form.
 */
export function mapMaskError(detail: string): MappedError {
  const text = detail.replace(/^Invalid input:\s*/, '');
  const match = /^bands\.(\d+)(?:\.([a-z_]+)(?:\.\d+)?)?:\s*(.*)$/s.exec(text);
  if (!match) return { path: null, band: null, message: text };
  const band = Number(match[1]);
  const place = placeOf(match[2] ? [band, match[2]] : [band], match[3] ?? text);
  return { path: place.field && `bands.${band}.${place.field}`, band, message: place.message };
}

/** A band-level problem's place in the form's errors (beside the band's fields). */
export const BAND_ERROR_KEY = 'band';

const { shape } = specMaskInputSchema;

/** Name, customer, revision, kind and notes as typed, checked by the API's own schema. */
const maskDetailsFields = {
  name: shape.name,
  customerId: chosenId.pipe(shape.customerId),
  revision: shape.revision,
  kind: shape.kind.unwrap(),
  notes: shape.notes.unwrap(),
};

// The band rows are the form's own state (selects and text fields): only their meaning is checked.
const bandValuesSchema = z.custom<BandValues>();

/** The details of a mask imported from a file: its bands come from the file, the form's list stays empty. */
export const maskDetailsFormSchema = z
  .object({ ...maskDetailsFields, bands: z.array(bandValuesSchema) })
  .transform(({ bands: _none, ...details }) => details);
export type MaskDetailsOutput = z.output<typeof maskDetailsFormSchema>;

/**
 * The form's values checked as the API checks them: typed text is read first (a number field
 * that is not a number is named), then the bands go through the API's schema, which runs the
 * engine's mask validation; its problems land on the form field they name. The output is the
 * request body, with the bands as entered (the API normalises them).
 */
export const maskFormSchema = z.object({
  ...maskDetailsFields,
  bands: z.array(bandValuesSchema).transform((rows, ctx): LimitBand[] => {
    const bands = rows.map(bandOf);
    const typing = bands.flatMap((band, index) =>
      typingProblems(band).map((p) => ({ path: [index, p.field], message: p.message })),
    );
    typing.forEach((p) => ctx.addIssue({ code: 'custom', ...p }));
    if (typing.length > 0) return z.NEVER;
    const checked = limitBandsSchema.safeParse(bands);
    if (checked.success) return bands;
    for (const issue of checked.error.issues) {
      const { band, field, message } = placeOf(issue.path, issue.message);
      const path = band === null ? [] : [band, field ?? BAND_ERROR_KEY];
      ctx.addIssue({ code: 'custom', path, message });
    }
    return z.NEVER;
  }),
});
export type MaskFormOutput = z.output<typeof maskFormSchema>;
