/*
 * What the design workspace sends and the API accepts: a new design, its name and spec mask, a
 * version's content (the Layer grid and its header), a new version, and the lifecycle steps. The
 * client's forms and the Layer grid check the same schemas and limits.
 */
import { z } from 'zod';
import { BACK_SURFACE_TREATMENTS } from '../designs.js';
import { finiteNumber, limitedText, optionalText, recordId, requiredText, versionToken } from './common.js';

/** Limits of a design and its versions; they catch typing slips — common practice (no source). */
export const DESIGN_LIMITS = {
  nameLength: 160,
  /** Most layers a design may have. */
  maxLayers: 400,
  /** Thickest layer, nm. */
  maxThicknessNm: 100_000,
  layerNotesLength: 500,
  /** Thickest substrate, mm. */
  maxSubstrateMm: 1000,
  referenceWavelengthNm: { min: 100, max: 20_000 },
  versionNotesLength: 8000,
  sourceFileLength: 255,
  commentLength: 4000,
} as const;

const { min: REF_MIN, max: REF_MAX } = DESIGN_LIMITS.referenceWavelengthNm;

/** A physical layer thickness in nm: greater than 0 and at most the limit (the engine allows 0 too). */
export const layerThicknessNm = finiteNumber('Enter the thickness in nm as a number')
  .gt(0, { error: 'Thickness must be greater than 0 nm' })
  .max(DESIGN_LIMITS.maxThicknessNm, {
    error: `Thickness must be at most ${DESIGN_LIMITS.maxThicknessNm} nm`,
  });

/** One row of the Layer grid, incident side first. */
export const designLayerSchema = z.strictObject({
  materialId: recordId('Choose a material'),
  thicknessNm: layerThicknessNm,
  /** Locked layers keep their thickness during Fit to mask. */
  locked: z.boolean({ error: 'locked must be true or false' }).default(false),
  notes: optionalText(DESIGN_LIMITS.layerNotesLength),
});

/** The editable content of a version (everything the Layer grid and its header hold). */
export const versionContentSchema = z.strictObject({
  incidentMaterialId: recordId('Choose the incident medium'),
  substrateMaterialId: recordId('Choose the substrate'),
  substrateThicknessMm: finiteNumber('Enter the substrate thickness in mm')
    .gt(0, { error: 'Must be greater than 0 mm' })
    .max(DESIGN_LIMITS.maxSubstrateMm, { error: `Must be at most ${DESIGN_LIMITS.maxSubstrateMm} mm` }),
  backSurface: z.enum(BACK_SURFACE_TREATMENTS, { error: 'Choose the back surface' }),
  referenceWavelengthNm: finiteNumber('Enter the reference wavelength in nm')
    .min(REF_MIN, { error: `Must be from ${REF_MIN} to ${REF_MAX} nm` })
    .max(REF_MAX, { error: `Must be from ${REF_MIN} to ${REF_MAX} nm` }),
  notes: optionalText(DESIGN_LIMITS.versionNotesLength),
  layers: z
    .array(designLayerSchema, { error: 'layers must be a list of layers' })
    .max(DESIGN_LIMITS.maxLayers, { error: `A design has at most ${DESIGN_LIMITS.maxLayers} layers` }),
});
export type VersionContentInput = z.output<typeof versionContentSchema>;

/** The optimistic-locking counter of a version's content that a save or submit sends back. */
function rowVersionField(missingMessage: string) {
  return z
    .number({ error: missingMessage })
    .int({ error: 'rowVersion must be a whole number' })
    .min(1, { error: 'rowVersion must be at least 1' });
}
const rowVersionToken = rowVersionField('rowVersion must be the row version last read');

/** A save of a draft carries the rowVersion the edit started from. */
export const saveVersionSchema = versionContentSchema.extend({ rowVersion: rowVersionToken });
export type SaveVersionInput = z.output<typeof saveVersionSchema>;

const designName = requiredText('Enter a name', DESIGN_LIMITS.nameLength);
/** The design's spec mask: one of its customer's, or null for none. */
const specMaskChoice = recordId('Choose a spec mask').nullable().optional();

/** A new design with the content of its first draft. */
export const createDesignSchema = versionContentSchema.extend({
  name: designName,
  customerId: recordId('Choose the customer'),
  specMaskId: specMaskChoice,
});
export type CreateDesignInput = z.output<typeof createDesignSchema>;

/** A rename or another spec mask, with the design's version token the change started from. */
export const updateDesignSchema = z.strictObject({
  version: versionToken,
  name: designName.optional(),
  specMaskId: specMaskChoice,
});
export type UpdateDesignInput = z.output<typeof updateDesignSchema>;

/** A new draft copied from a version, or with the content of an imported stack file instead. */
export const newVersionSchema = z.strictObject({
  fromNumber: recordId('fromNumber must be the number of the version to start from'),
  content: versionContentSchema.optional(),
  /** Name of the stack file the content came from, for the audit trail. */
  sourceFile: requiredText('Enter the name of the stack file', DESIGN_LIMITS.sourceFileLength).optional(),
});
export type NewVersionInput = z.output<typeof newVersionSchema>;

/** A body that may be left out: a missing one is checked as {}, so a required field still says so. */
function omissibleBody<T extends z.ZodObject>(schema: T) {
  return schema.prefault({} as z.input<T>);
}

/** A lifecycle step's comment, trimmed; a return's must say what to change. */
export const stepComment = limitedText(DESIGN_LIMITS.commentLength).trim();
export const returnComment = requiredText(
  'A return needs a comment: say what to change',
  DESIGN_LIMITS.commentLength,
);

const transitionFields = z.strictObject({
  rowVersion: rowVersionToken.optional(),
  comment: stepComment.optional(),
});

/**
 * A lifecycle step (approve, release, retire): an optional comment, trimmed. The body may be left
 * out altogether (a step without a comment), as before.
 */
export const transitionSchema = omissibleBody(transitionFields);
export type TransitionInput = z.output<typeof transitionSchema>;

/** Submitting names the rowVersion the engineer reviewed, so what is submitted is what they saw. */
export const submitSchema = omissibleBody(
  transitionFields.extend({
    rowVersion: rowVersionField('rowVersion is required to submit: the row version you reviewed'),
  }),
);

/** Returning a version to its author says what to change. */
export const returnSchema = omissibleBody(
  transitionFields.extend({
    comment: returnComment,
  }),
);
