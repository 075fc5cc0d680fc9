/*
 * What a spec-mask form sends and the API accepts. The limit bands are held to the optics
 * engine's own rules (validateSpecMask): the schema runs it and puts each problem at the field it
 * names, in the engine's words, so a band rule lives in the engine alone.
 */
import { z } from 'zod';
import { SPEC_MASK_KINDS } from '../customers.js';
import { MAX_MASK_BANDS, validateSpecMask, type LimitBand } from '../optics/mask.js';
import { engineProblem, enginePath, limitedText, recordId, requiredText, versionToken } from './common.js';

/** Limits of a mask's details; they catch typing slips — common practice (no source). */
export const SPEC_MASK_LIMITS = {
  nameLength: 160,
  revisionLength: 20,
  notesLength: 4000,
} as const;

/** Largest spec-mask CSV file accepted (bytes of text). */
export const MAX_MASK_CSV_BYTES = 200_000;

/**
 * A problem the engine found, as a path below the mask's `bands`: `bands[1].to_nm` → [1, 'to_nm'].
 * `index`: the problem came from checking band `index` on its own (as the mask's band 0).
 */
function bandIssuePath(field: string, index?: number): (string | number)[] {
  const path = enginePath(field).slice(1);
  if (index === undefined) return path;
  return path.length === 0 ? [index] : [index, ...path.slice(1)];
}

/**
 * The limit bands of a mask, checked and normalised by the engine (defaults filled in, an angle
 * range's angles listed). Each band is checked on its own first, so every bad band is named at
 * once; then the mask as a whole (how many bands and samples, bands that contradict each other).
 */
export const limitBandsSchema = z
  .array(z.unknown(), { error: 'bands must be a list of limit bands' })
  .transform((bands, ctx): LimitBand[] => {
    let bad = false;
    if (bands.length <= MAX_MASK_BANDS) {
      bands.forEach((band, index) => {
        const problem = engineProblem(() => validateSpecMask({ bands: [band] }));
        if (!problem) return;
        bad = true;
        ctx.addIssue({ code: 'custom', path: bandIssuePath(problem.field, index), message: problem.problem });
      });
    }
    if (bad) return z.NEVER;
    let checked: LimitBand[] = [];
    const problem = engineProblem(() => {
      checked = validateSpecMask({ bands }).bands;
    });
    if (!problem) return checked;
    ctx.addIssue({ code: 'custom', path: bandIssuePath(problem.field), message: problem.problem });
    return z.NEVER;
  });

/** Name, customer, revision, notes and kind: what every way of making a mask asks for. */
const specMaskDetailsShape = {
  name: requiredText('Enter a name', SPEC_MASK_LIMITS.nameLength),
  customerId: recordId('Choose the customer'),
  revision: requiredText('Enter a revision', SPEC_MASK_LIMITS.revisionLength),
  /** Missing: empty for a new mask, kept as it was by an edit. */
  notes: limitedText(SPEC_MASK_LIMITS.notesLength).optional(),
  /** 'customer' (default): the customer's specification; 'internal': the shop's own design target. */
  kind: z.enum(SPEC_MASK_KINDS, { error: `Must be one of ${SPEC_MASK_KINDS.join(', ')}` }).optional(),
};

export const specMaskDetailsSchema = z.strictObject(specMaskDetailsShape);

export const specMaskInputSchema = z.strictObject({ ...specMaskDetailsShape, bands: limitBandsSchema });
/** A new mask as the API receives it (names trimmed, bands normalised by the engine). */
export type SpecMaskInput = z.output<typeof specMaskInputSchema>;

/** An edit carries the version it was based on. */
export const specMaskUpdateSchema = specMaskInputSchema.extend({ version: versionToken });
export type SpecMaskUpdate = z.output<typeof specMaskUpdateSchema>;

/** A new mask from a CSV file; the API reads its rows and names a bad one by its line. */
export const specMaskCsvImportSchema = z.strictObject({
  ...specMaskDetailsShape,
  csv: z.string({ error: 'csv must be the text of the file' }),
});
export type SpecMaskCsvImport = z.output<typeof specMaskCsvImportSchema>;
