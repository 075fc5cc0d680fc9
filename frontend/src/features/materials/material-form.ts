/*
 * The material form's values and the rules of the API behind them: the name, range and provenance
 * rules are the shared material schema's, and each model field is checked by the engine's own
 * validateMaterialModel (constant n > 0, k ≥ 0; Cauchy A > 0; Sellmeier C ≥ 0; every number finite).
 */
import {
  OpticsInputError,
  indexAt,
  materialNameField,
  provenanceIssues,
  provenanceSchema,
  rangeNmSchema,
  validateMaterialModel,
  type MaterialModel,
  type ProvenanceIssue,
  type ProvenanceKind,
} from '@quietglass/shared';
import type { ZodType } from 'zod';
import { parseNumberInput } from '../../lib/format';
import { typedNumber } from '../../lib/validation';
import type { MaterialInput } from './api/create-material';
import type { MaterialView } from './api/get-materials';

export type EditableModelKind = 'constant' | 'cauchy' | 'sellmeier';
export type ModelKind = MaterialModel['model'];

export const MODEL_KIND_LABELS: Readonly<Record<ModelKind, string>> = {
  constant: 'Constant',
  cauchy: 'Cauchy',
  sellmeier: 'Sellmeier',
  table: 'Table (n,k file)',
};

export interface MaterialFormValues {
  name: string;
  kind: EditableModelKind | 'table';
  n: string;
  k: string;
  A: string;
  B: string;
  C: string;
  B1: string;
  B2: string;
  B3: string;
  C1: string;
  C2: string;
  C3: string;
  /** How C1–C3 are entered: Cᵢ in µm², or the resonance wavelength λᵢ in µm (Cᵢ = λᵢ²). */
  sellmeierForm: SellmeierForm;
  rangeFrom: string;
  rangeTo: string;
  /** Outside the valid range: hold the end values and warn (true) or refuse (false). */
  holdOutside: boolean;
  provenanceKind: ProvenanceKind | '';
  source: string;
  date: string;
  run: string;
  notes: string;
}

export type SellmeierForm = 'C' | 'lambda';

export const EMPTY_MATERIAL_VALUES: MaterialFormValues = {
  name: '',
  kind: 'constant',
  n: '',
  k: '0',
  A: '',
  B: '0',
  C: '0',
  B1: '',
  B2: '',
  B3: '',
  C1: '',
  C2: '',
  C3: '',
  sellmeierForm: 'C',
  rangeFrom: '',
  rangeTo: '',
  holdOutside: false,
  provenanceKind: '',
  source: '',
  date: '',
  run: '',
  notes: '',
};

type Verdict = true | string;

const num = (text: string) => parseNumberInput(text);
const blank = (text: string) => text.trim() === '';

/** The first message of one of the API's field schemas for `value`, or true. */
function verdict(schema: ZodType, value: unknown): Verdict {
  const parsed = schema.safeParse(value);
  return parsed.success || (parsed.error.issues[0]?.message ?? 'Not valid');
}

/** The provenance fields every material dialog has. */
type ProvenanceValues = Pick<MaterialFormValues, 'provenanceKind' | 'source' | 'date' | 'run'>;

/** The shared provenance rule's message for one field of the values, or true. */
function provenanceRule(field: ProvenanceIssue['path'][1], values: ProvenanceValues): Verdict {
  const kind = values.provenanceKind === '' ? undefined : values.provenanceKind;
  const issue = provenanceIssues({
    typical: kind === 'typical',
    provenance: {
      kind,
      source: values.source.trim(),
      date: values.date.trim() || null,
      run: values.run.trim(),
    },
  }).find((i) => i.path[1] === field);
  return issue?.message ?? true;
}

/**
 * The engine's own rule for one model field: the typed number is put into a model that is valid
 * otherwise (`probe`) and checked by validateMaterialModel; its problem is named by the field.
 */
function engineRule(label: string, probe: (x: number) => unknown) {
  return (v: string): Verdict => {
    const x = num(v);
    if (x === null) return `${label} must be a number`;
    try {
      validateMaterialModel(probe(x), 'model');
      return true;
    } catch (error) {
      if (error instanceof OpticsInputError) return `${label} ${error.problem}`;
      throw error;
    }
  };
}

/** A field that may be left empty (its model default applies). */
function orBlank(rule: (v: string) => Verdict) {
  return (v: string): Verdict => blank(v) || rule(v);
}

const { shape: stated } = provenanceSchema;
const { shape: range } = rangeNmSchema;

export const materialRules = {
  name: (v: string): Verdict => verdict(materialNameField, v),
  /** Constant n. */
  n: engineRule('n', (n) => ({ model: 'constant', n })),
  /** Cauchy A. */
  A: engineRule('A', (A) => ({ model: 'cauchy', A })),
  /** k of any model; empty is 0. */
  k: orBlank(engineRule('k', (k) => ({ model: 'constant', n: 1, k }))),
  cauchyB: orBlank(engineRule('B', (B) => ({ model: 'cauchy', A: 1, B }))),
  cauchyC: orBlank(engineRule('C', (C) => ({ model: 'cauchy', A: 1, C }))),
  sellmeierB: (i: 1 | 2 | 3) => {
    const rule = engineRule(`B${i}`, (b) => ({ model: 'sellmeier', B: [b], C: [0] }));
    return i === 1 ? rule : orBlank(rule);
  },
  sellmeierC:
    (i: 1 | 2 | 3) =>
    (v: string, values: MaterialFormValues): Verdict => {
      const what = values.sellmeierForm === 'lambda' ? `λ${i}` : `C${i}`;
      if (blank(values[`B${i}`])) return blank(v) || `${what} needs a B${i}`;
      // A resonance wavelength λᵢ is held to the same rule as Cᵢ = λᵢ² (≥ 0) before it is squared.
      return engineRule(what, (c) => ({ model: 'sellmeier', B: [1], C: [c] }))(v);
    },
  provenanceKind: (v: string): Verdict =>
    provenanceRule('kind', {
      provenanceKind: v as ProvenanceValues['provenanceKind'],
      source: '',
      date: '',
      run: '',
    }),
  source: (v: string, values: ProvenanceValues): Verdict => {
    const length = verdict(stated.source, v);
    return length === true ? provenanceRule('source', { ...values, source: v }) : length;
  },
  measuredDate: (v: string, values: ProvenanceValues): Verdict => {
    const form = blank(v) || verdict(stated.date, v.trim());
    return form === true ? provenanceRule('date', { ...values, date: v }) : form;
  },
  run: (v: string, values: ProvenanceValues): Verdict => {
    const length = verdict(stated.run, v);
    return length === true ? provenanceRule('run', { ...values, run: v }) : length;
  },
  rangeFrom: (v: string): Verdict => verdict(typedNumber.pipe(range.from), v),
  rangeTo: (v: string, values: MaterialFormValues): Verdict => {
    const to = verdict(typedNumber.pipe(range.to), v);
    if (to !== true) return to;
    const checked = rangeNmSchema.safeParse({ from: num(values.rangeFrom) ?? Number.NaN, to: num(v) });
    const reversed = checked.success ? undefined : checked.error.issues.find((i) => i.path[0] === 'to');
    return reversed?.message ?? true;
  },
};

function optionalNumber(text: string): number {
  return blank(text) ? 0 : Number(num(text));
}

/** The valid range the values give (nm), or null while it is not valid. */
function rangeOf(values: MaterialFormValues): { from: number; to: number } | null {
  const from = num(values.rangeFrom);
  const to = num(values.rangeTo);
  return from !== null && to !== null && from > 0 && to > from ? { from, to } : null;
}

/** Cᵢ (µm²) from the entered C field: as is, or squared when a resonance wavelength λᵢ (µm) was entered. */
function sellmeierC(values: MaterialFormValues, i: 1 | 2 | 3): number {
  const x = Number(num(values[`C${i}`]));
  return values.sellmeierForm === 'lambda' ? x * x : x;
}

/**
 * C fields converted when the entry form changes: λᵢ = √Cᵢ, Cᵢ = λᵢ² (blank and unreadable fields
 * stay as typed).
 */
export function convertSellmeierC(text: string, to: SellmeierForm): string {
  const x = num(text);
  if (x === null || x < 0) return text;
  return String(to === 'lambda' ? Math.sqrt(x) : x * x);
}

/**
 * The dispersion model the values describe (for a table material, the unchanged original). A
 * formula model carries the valid range (the API sets it from the range too) and the hold choice.
 */
export function modelFromValues(values: MaterialFormValues, original: MaterialModel | null): MaterialModel {
  const range = rangeOf(values);
  const bounded = range ? { validNm: range, clamp: values.holdOutside } : {};
  switch (values.kind) {
    case 'constant':
      return { model: 'constant', n: Number(num(values.n)), k: optionalNumber(values.k) };
    case 'cauchy': {
      const model: MaterialModel = {
        model: 'cauchy',
        ...bounded,
        A: Number(num(values.A)),
        B: optionalNumber(values.B),
        C: optionalNumber(values.C),
      };
      // An absorption tail has no fields here; an edit keeps it as it was.
      if (original?.model === 'cauchy' && original.absorption)
        return { ...model, absorption: original.absorption };
      return { ...model, k: optionalNumber(values.k) };
    }
    case 'sellmeier': {
      const terms = ([1, 2, 3] as const).filter((i) => !blank(values[`B${i}`]));
      return {
        model: 'sellmeier',
        ...bounded,
        B: terms.map((i) => Number(num(values[`B${i}`]))),
        C: terms.map((i) => sellmeierC(values, i)),
        k: optionalNumber(values.k),
      };
    }
    case 'table':
      if (original?.model !== 'table') throw new Error('a table material needs its original data');
      return { ...original, clamp: values.holdOutside };
  }
}

export function materialInputOf(values: MaterialFormValues, original: MaterialModel | null): MaterialInput {
  return {
    name: values.name.trim(),
    model: modelFromValues(values, original),
    rangeNm: { from: Number(num(values.rangeFrom)), to: Number(num(values.rangeTo)) },
    typical: values.provenanceKind === 'typical',
    provenance: {
      kind: values.provenanceKind as ProvenanceKind,
      source: values.source.trim(),
      notes: values.notes.trim(),
      ...(blank(values.date) ? {} : { date: values.date.trim() }),
      ...(blank(values.run) ? {} : { run: values.run.trim() }),
    },
  };
}

/** One line of the live readout: n and k at a wavelength, or why there is none. */
export interface IndexReading {
  wavelengthNm: number;
  n: number | null;
  k: number | null;
  /** Outside the valid range and held at the end value. */
  held: boolean;
  problem: string | null;
}

/**
 * n and k of the values' model at each wavelength, as the engine evaluates it (with the valid
 * range and hold choice); a wavelength outside a refused range or an unfinished model reads as a
 * problem instead.
 */
export function readIndex(
  values: MaterialFormValues,
  original: MaterialModel | null,
  wavelengthsNm: readonly number[],
): IndexReading[] {
  let model: MaterialModel | null = null;
  let problem: string | null = null;
  try {
    model = modelFromValues(values, original);
  } catch {
    problem = 'enter the model first';
  }
  const range = rangeOf(values);
  return wavelengthsNm.map((wavelengthNm) => {
    if (!model) return { wavelengthNm, n: null, k: null, held: false, problem };
    try {
      const { n, k } = indexAt(model, wavelengthNm);
      const held = range !== null && (wavelengthNm < range.from || wavelengthNm > range.to);
      return { wavelengthNm, n, k, held, problem: null };
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      return {
        wavelengthNm,
        n: null,
        k: null,
        held: false,
        problem: /outside/.test(message) ? 'outside the valid range (refused)' : 'no index: check the model',
      };
    }
  });
}

export function valuesOf(material: MaterialView): MaterialFormValues {
  const { model } = material;
  const base: MaterialFormValues = {
    ...EMPTY_MATERIAL_VALUES,
    name: material.name,
    kind: model.model,
    rangeFrom: String(material.rangeNm.from),
    rangeTo: String(material.rangeNm.to),
    holdOutside: 'clamp' in model && model.clamp === true,
    provenanceKind: material.provenance.kind,
    source: material.provenance.source,
    date: material.provenance.date ?? '',
    run: material.provenance.run,
    notes: material.provenance.notes,
  };
  switch (model.model) {
    case 'constant':
      return { ...base, n: String(model.n), k: String(model.k ?? 0) };
    case 'cauchy':
      return {
        ...base,
        A: String(model.A),
        B: String(model.B ?? 0),
        C: String(model.C ?? 0),
        k: String(model.k ?? 0),
      };
    case 'sellmeier':
      return {
        ...base,
        B1: String(model.B[0] ?? ''),
        B2: model.B[1] === undefined ? '' : String(model.B[1]),
        B3: model.B[2] === undefined ? '' : String(model.B[2]),
        C1: String(model.C[0] ?? ''),
        C2: model.C[1] === undefined ? '' : String(model.C[1]),
        C3: model.C[2] === undefined ? '' : String(model.C[2]),
        k: String(model.k ?? 0),
      };
    case 'table':
      return base;
  }
}

/** A short account of a model's parameters, e.g. "n = 1.38, k = 0". */
export function describeModel(model: MaterialModel): string {
  switch (model.model) {
    case 'constant':
      return `n = ${model.n}, k = ${model.k ?? 0}`;
    case 'cauchy':
      return `n = ${model.A} + ${model.B ?? 0}/λ² + ${model.C ?? 0}/λ⁴ (λ in µm), ${
        model.absorption
          ? `k = ${model.absorption.k}·exp(${model.absorption.exponent}·(1/λ − 1/${model.absorption.reference / 1000}))`
          : `k = ${model.k ?? 0}`
      }`;
    case 'sellmeier':
      return `n² = 1 + Σ Bᵢλ²/(λ² − Cᵢ), B = ${model.B.join(', ')}, C = ${model.C.join(', ')} µm² (λᵢ = ${model.C.map((c) => Number(Math.sqrt(c).toPrecision(8))).join(', ')} µm), k = ${model.k ?? 0}`;
    case 'table':
      return `${model.wavelengths.length} rows, ${model.interpolation ?? 'linear'} interpolation${model.clamp ? ', held at the ends outside' : ''}`;
  }
}
