/*
 * What the API accepts for the materials library (a material entered by hand, an n,k file, a
 * published constants file, retire and restore); the material dialogs check the same schemas. The
 * dispersion model itself is checked by the engine's own validator, so its rules live there once.
 */
import { z } from 'zod';
import {
  MAX_RUN_LENGTH,
  MAX_SOURCE_LENGTH,
  PROVENANCE_KINDS,
  type MaterialProvenance,
  type ProvenanceKind,
} from '../materials.js';
import { evaluateIndex, validateMaterialModel, type MaterialModel } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import {
  calendarDate,
  enginePath,
  fileNameField,
  finiteNumber,
  optionalText,
  requiredText,
  versionToken,
} from './common.js';

/** Limits of a material's texts — common practice (no source). */
export const MATERIAL_LIMITS = {
  nameLength: 120,
  notesLength: 4000,
  /** Notes added below a constants file's own sample notes. */
  importNotesLength: 2000,
} as const;

/** Points at which a model is checked across its stated range (poles, n ≤ 0, k < 0). */
const RANGE_CHECK_POINTS = 201;

/**
 * The engine validates the model (defaults filled in); then the model must give a physical index
 * across the whole stated range, which catches Sellmeier poles and Cauchy fits that go negative. A
 * formula model takes the stated range as its valid range, so the engine refuses it (or, with
 * `clamp`, holds the end values and warns) outside it, as it does for a table. Throws
 * {@link OpticsInputError} naming the field (`model.B`, `rangeNm`, …).
 */
export function checkMaterialModel(raw: unknown, rangeNm: { from: number; to: number }): MaterialModel {
  const stated = typeof raw === 'object' && raw !== null ? (raw as Record<string, unknown>) : null;
  const formula = stated?.model === 'cauchy' || stated?.model === 'sellmeier';
  const model = validateMaterialModel(
    formula ? { ...stated, validNm: { from: rangeNm.from, to: rangeNm.to } } : raw,
    'model',
  );
  if (model.model === 'table' && !model.clamp) {
    const lo = model.wavelengths[0];
    const hi = model.wavelengths[model.wavelengths.length - 1];
    if (lo === undefined || hi === undefined || rangeNm.from < lo || rangeNm.to > hi) {
      throw new OpticsInputError(
        'rangeNm',
        `the range ${rangeNm.from}–${rangeNm.to} nm reaches beyond the table (${lo}–${hi} nm)`,
      );
    }
  }
  const grid = new Float64Array(RANGE_CHECK_POINTS);
  for (let i = 0; i < grid.length; i++)
    grid[i] = rangeNm.from + ((rangeNm.to - rangeNm.from) * i) / (grid.length - 1);
  evaluateIndex({ n: new Float64Array(grid.length), k: new Float64Array(grid.length) }, model, grid, 'model');
  return model;
}

export const provenanceSchema = z.strictObject(
  {
    /** Required unless `typical: true` says it. */
    kind: z.enum(PROVENANCE_KINDS, { error: 'Say where the data come from' }).optional(),
    source: optionalText(MAX_SOURCE_LENGTH).unwrap().trim().optional(),
    run: optionalText(MAX_RUN_LENGTH).unwrap().trim().optional(),
    date: calendarDate('A date as YYYY-MM-DD').nullable().optional(),
    notes: optionalText(MATERIAL_LIMITS.notesLength),
  },
  { error: 'provenance must be an object' },
);

/** A material's name in the library. */
export const materialNameField = requiredText('Enter a name', MATERIAL_LIMITS.nameLength);

/** Name and provenance: what every way of creating a material asks for. */
const materialMeta = {
  name: materialNameField,
  typical: z.boolean({ error: 'typical must be true or false' }).optional(),
  provenance: provenanceSchema.optional(),
};

/** A provenance as stated (fields trimmed); `typical: true` may stand for its kind. */
export interface StatedProvenance {
  typical?: boolean;
  provenance?: { kind?: ProvenanceKind; source?: string; run?: string; date?: string | null };
}

/** One thing missing from a provenance, at its field (`['provenance', 'source']`, …). */
export interface ProvenanceIssue {
  path: ['typical'] | ['provenance', 'kind' | 'source' | 'date' | 'run'];
  message: string;
}

/**
 * What is missing from a provenance, none when it is complete: its kind (or `typical: true`), and
 * for a published reference the reference, for a measurement its date and run. The API's schemas
 * and the material dialogs both use this rule.
 */
export function provenanceIssues(input: StatedProvenance): ProvenanceIssue[] {
  const stated = input.provenance?.kind;
  if (stated && input.typical !== undefined && input.typical !== (stated === 'typical')) {
    return [
      { path: ['typical'], message: `typical (${input.typical}) contradicts provenance.kind "${stated}"` },
    ];
  }
  const kind = stated ?? (input.typical ? 'typical' : undefined);
  if (!kind) return [{ path: ['provenance', 'kind'], message: 'Say where the data come from' }];
  const { source = '', run = '', date = null } = input.provenance ?? {};
  const issues: ProvenanceIssue[] = [];
  if (kind === 'published' && source === '')
    issues.push({ path: ['provenance', 'source'], message: 'A published material needs its reference' });
  if (kind === 'measured' && !date)
    issues.push({ path: ['provenance', 'date'], message: 'A measurement needs its date' });
  if (kind === 'measured' && run === '')
    issues.push({ path: ['provenance', 'run'], message: 'A measurement needs its run' });
  return issues;
}

/** The complete provenance, or null with its problems added to `ctx`. */
function resolvedProvenance(
  input: { typical?: boolean; provenance?: z.output<typeof provenanceSchema> },
  ctx: z.RefinementCtx,
): MaterialProvenance | null {
  const issues = provenanceIssues(input);
  for (const { path, message } of issues) ctx.addIssue({ code: 'custom', path, message });
  const kind = input.provenance?.kind ?? (input.typical ? 'typical' : undefined);
  if (issues.length > 0 || !kind) return null;
  const { source = '', run = '', date = null, notes = '' } = input.provenance ?? {};
  return { kind, source, run, date, notes };
}

/** The valid range in nm: 0 < from < to. */
export const rangeNmSchema = z
  .strictObject(
    {
      from: finiteNumber('From must be a wavelength in nm').gt(0, {
        error: 'From must be a wavelength greater than 0 nm',
      }),
      to: finiteNumber('To must be a wavelength in nm'),
    },
    { error: 'rangeNm must be an object { from, to }' },
  )
  .refine((r) => r.to > r.from, { error: 'To must be above From', path: ['to'] });

const materialFields = z.strictObject({
  ...materialMeta,
  rangeNm: rangeNmSchema,
  /** Checked by the engine's validator against the range (see {@link checkMaterialModel}). */
  model: z.record(z.string(), z.unknown(), { error: 'model must be a dispersion model object' }),
});

/** A material as stored: the engine's model (defaults filled in) and a complete provenance. */
function resolvedMaterial<T extends z.output<typeof materialFields>>(input: T, ctx: z.RefinementCtx) {
  const provenance = resolvedProvenance(input, ctx);
  let model: MaterialModel | null = null;
  try {
    model = checkMaterialModel(input.model, input.rangeNm);
  } catch (error) {
    if (!(error instanceof OpticsInputError)) throw error;
    ctx.addIssue({ code: 'custom', path: enginePath(error.field), message: error.problem });
  }
  if (!provenance || !model) return z.NEVER;
  const { typical: _typical, ...rest } = input;
  return { ...rest, model, provenance };
}

/** Create a material (constant, Cauchy, Sellmeier or table) with its range and provenance. */
export const materialInputSchema = materialFields.transform(resolvedMaterial);
export type MaterialInput = z.output<typeof materialInputSchema>;

/** Replace a material: the version the edit started from (optimistic locking). */
export const materialUpdateSchema = materialFields
  .extend({ version: versionToken })
  .transform(resolvedMaterial);
export type MaterialUpdate = z.output<typeof materialUpdateSchema>;

const wavelengthUnit = z.enum(['nm', 'um'], { error: 'unit must be nm or um' });

/** The parsing choices of an n,k CSV file, for its preview. */
export const nkCsvSchema = z.strictObject({
  csv: z.string({ error: 'csv must be the text of the file' }),
  /** nm or µm; may be left out when the header names the unit ("Wavelength (nm)"). */
  unit: wavelengthUnit.optional(),
});
export type NkCsvInput = z.output<typeof nkCsvSchema>;

/** A tabulated material from an n,k CSV file's text; the file is kept for download. */
export const importMaterialCsvSchema = z
  .strictObject({
    ...materialMeta,
    ...nkCsvSchema.shape,
    interpolation: z
      .enum(['linear', 'pchip'], { error: 'interpolation must be linear or pchip' })
      .default('linear'),
    /** Outside the table: hold the end values and warn (true) or refuse (default). */
    clamp: z.boolean({ error: 'clamp must be true or false' }).default(false),
    /** The uploaded file's name, kept with its text; the material's name when left out or empty. */
    fileName: optionalText(255).unwrap().trim().optional(),
  })
  .transform((input, ctx) => {
    const provenance = resolvedProvenance(input, ctx);
    if (!provenance) return z.NEVER;
    const { typical: _typical, ...rest } = input;
    return { ...rest, provenance };
  });
export type ImportMaterialCsvInput = z.output<typeof importMaterialCsvSchema>;

/** A material from a published optical-constants file: its reference becomes the provenance. */
export const importConstantsFileSchema = z.strictObject({
  name: materialMeta.name,
  text: z.string({ error: 'text must be the text of the file' }),
  fileName: fileNameField,
  /** Outside the stated range: hold the end values and warn (true) or refuse (default). */
  clamp: z.boolean({ error: 'clamp must be true or false' }).default(false),
  /** Added below the file's own sample notes. */
  notes: optionalText(MATERIAL_LIMITS.importNotesLength).unwrap().trim().default(''),
});
export type ImportConstantsFileInput = z.output<typeof importConstantsFileSchema>;

/** Retire or restore a material: the version the action was decided on. */
export const materialVersionSchema = z.strictObject({ version: versionToken });
export type MaterialVersionInput = z.output<typeof materialVersionSchema>;
