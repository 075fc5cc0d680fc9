/*
 * The material form's values and the rules of the API behind them (MaterialDto and the engine's
 * validateMaterialModel: constant n > 0, k ≥ 0; Cauchy A > 0, B and C finite; Sellmeier 1–3 terms,
 * C ≥ 0; every number finite; range 0 < from < to; date YYYY-MM-DD; name 1–120 characters).
 */
import type { MaterialModel } from '@quietglass/shared';
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
  rangeFrom: string;
  rangeTo: string;
  typical: boolean;
  source: string;
  date: string;
  notes: string;
}

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
  rangeFrom: '',
  rangeTo: '',
  typical: false,
  source: '',
  date: '',
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
      if (blank(b)) return blank(v) || `C${i} needs a B${i}`;
      const x = num(v);
      return (x !== null && x >= 0) || `C${i} must be a number ≥ 0 (µm²)`;
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

/** The dispersion model the values describe (for a table material, the unchanged original). */
export function modelFromValues(values: MaterialFormValues, original: MaterialModel | null): MaterialModel {
  switch (values.kind) {
    case 'constant':
      return { model: 'constant', n: Number(num(values.n)), k: optionalNumber(values.k) };
    case 'cauchy': {
      const model: MaterialModel = {
        model: 'cauchy',
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
        B: terms.map((i) => Number(num(values[`B${i}`]))),
        C: terms.map((i) => Number(num(values[`C${i}`]))),
        k: optionalNumber(values.k),
      };
    }
    case 'table':
      if (original?.model !== 'table') throw new Error('a table material needs its original data');
      return original;
  }
}

export function materialInputOf(values: MaterialFormValues, original: MaterialModel | null): MaterialInput {
  return {
    name: values.name.trim(),
    model: modelFromValues(values, original),
    rangeNm: { from: Number(num(values.rangeFrom)), to: Number(num(values.rangeTo)) },
    typical: values.typical,
    provenance: {
      source: values.source.trim(),
      notes: values.notes.trim(),
      ...(blank(values.date) ? {} : { date: values.date.trim() }),
    },
  };
}

export function valuesOf(material: MaterialView): MaterialFormValues {
  const { model } = material;
  const base: MaterialFormValues = {
    ...EMPTY_MATERIAL_VALUES,
    name: material.name,
    kind: model.model,
    rangeFrom: String(material.rangeNm.from),
    rangeTo: String(material.rangeNm.to),
    typical: material.typical,
    source: material.provenance.source,
    date: material.provenance.date ?? '',
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
      return `n² = 1 + Σ Bᵢλ²/(λ² − Cᵢ), B = ${model.B.join(', ')}, C = ${model.C.join(', ')} µm², k = ${model.k ?? 0}`;
    case 'table':
      return `${model.wavelengths.length} rows, ${model.interpolation ?? 'linear'} interpolation${model.clamp ? ', held at the ends outside' : ''}`;
  }
}
