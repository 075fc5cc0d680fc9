/*
 * The material form's values and the rules of the API behind them (MaterialDto and the engine's
 * validateMaterialModel: constant n > 0, k ≥ 0; Cauchy A > 0, B and C finite; Sellmeier 1–3 terms,
 * C ≥ 0; every number finite; range 0 < from < to; date YYYY-MM-DD; name 1–120 characters).
 */
import {
  MAX_RUN_LENGTH,
  MAX_SOURCE_LENGTH,
  indexAt,
  provenanceProblem,
  type MaterialModel,
  type ProvenanceKind,
} from '@quietglass/shared';
import { parseNumberInput } from '../../lib/format';
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

export const MAX_NAME_LENGTH = 120;

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

export const materialRules = {
  name: (v: string): Verdict =>
    blank(v) ? 'Enter a name' : v.trim().length <= MAX_NAME_LENGTH || `At most ${MAX_NAME_LENGTH} characters`,
  positive:
    (what: string) =>
    (v: string): Verdict => {
      const x = num(v);
      return (x !== null && x > 0) || `${what} must be a number greater than 0`;
    },
  nonNegative:
    (what: string) =>
    (v: string): Verdict => {
      if (blank(v)) return true;
      const x = num(v);
      return (x !== null && x >= 0) || `${what} must be a number ≥ 0 (k > 0 is absorption)`;
    },
  finiteOrBlank:
    (what: string) =>
    (v: string): Verdict =>
      blank(v) || num(v) !== null || `${what} must be a number`,
  sellmeierB:
    (i: 1 | 2 | 3) =>
    (v: string): Verdict => {
      if (i > 1 && blank(v)) return true;
      return num(v) !== null || `B${i} must be a number`;
    },
  sellmeierC:
    (i: 1 | 2 | 3) =>
    (v: string, values: MaterialFormValues): Verdict => {
      const b = values[`B${i}`];
      const what = values.sellmeierForm === 'lambda' ? `λ${i}` : `C${i}`;
      if (blank(b)) return blank(v) || `${what} needs a B${i}`;
      const x = num(v);
      return (
        (x !== null && x >= 0) ||
        (values.sellmeierForm === 'lambda'
          ? `λ${i} must be a wavelength ≥ 0 (µm)`
          : `C${i} must be a number ≥ 0 (µm²)`)
      );
    },
  provenanceKind: (v: string): Verdict => v !== '' || 'Say where the data come from',
  source: (v: string, values: MaterialFormValues): Verdict => {
    if (v.trim().length > MAX_SOURCE_LENGTH) return `At most ${MAX_SOURCE_LENGTH} characters`;
    return values.provenanceKind === 'published' && blank(v)
      ? 'A published material needs its reference'
      : true;
  },
  measuredDate: (v: string, values: MaterialFormValues): Verdict => {
    if (!blank(v) && !/^\d{4}-\d{2}-\d{2}$/.test(v.trim())) return 'A date as YYYY-MM-DD';
    return values.provenanceKind === 'measured' && blank(v) ? 'A measurement needs its date' : true;
  },
  run: (v: string, values: MaterialFormValues): Verdict => {
    if (v.trim().length > MAX_RUN_LENGTH) return `At most ${MAX_RUN_LENGTH} characters`;
    return values.provenanceKind === 'measured' && blank(v) ? 'A measurement needs its run' : true;
  },
  rangeFrom: (v: string): Verdict => {
    const x = num(v);
    return (x !== null && x > 0) || 'From must be a wavelength greater than 0 nm';
  },
  rangeTo: (v: string, values: MaterialFormValues): Verdict => {
    const to = num(v);
    const from = num(values.rangeFrom);
    if (to === null) return 'To must be a wavelength in nm';
    return from === null || to > from || 'To must be above From';
  },
  date: (v: string): Verdict => blank(v) || /^\d{4}-\d{2}-\d{2}$/.test(v.trim()) || 'A date as YYYY-MM-DD',
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

/** The shared provenance rule on the form's values (null when complete). */
export function provenanceOfValuesProblem(values: MaterialFormValues): string | null {
  if (values.provenanceKind === '') return 'Say where the data come from';
  return provenanceProblem({
    kind: values.provenanceKind,
    source: values.source,
    date: values.date,
    run: values.run,
  });
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
