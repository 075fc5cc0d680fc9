/*
 * What the optimisation forms send and the API accepts: Fit to mask, Grow layers, Yield forecast,
 * Run diagnosis and accepting a result. Defaults are the engine's own, filled in here so the API,
 * the forms and the engine start from the same numbers.
 */
import { z } from 'zod';
import { DEFAULT_FACTOR_RANGE } from '../optimise/diagnosis.js';
import {
  DEFAULT_MAX_ITERATIONS,
  DEFAULT_MAX_THICKNESS_NM,
  DEFAULT_MIN_THICKNESS_NM,
} from '../optimise/fit.js';
import {
  DEFAULT_MAX_LAYERS,
  DEFAULT_MAX_STEPS,
  DEFAULT_MAX_TOTAL_THICKNESS_NM,
  GROWTH_MERITS,
  type GrowthMerit,
} from '../optimise/needle.js';
import { DEFAULT_NEEDLES_PER_STEP } from '../optimise/options.js';
import {
  DEFAULT_SEED,
  DEFAULT_TRIALS,
  ERROR_DISTRIBUTIONS,
  MAX_SEED,
  MAX_TRIALS,
} from '../optimise/yield.js';
import { finiteNumber, recordId } from './common.js';
import { targetMarginPercentField } from './shop.js';

export { DEFAULT_FACTOR_RANGE, DEFAULT_NEEDLES_PER_STEP };

/**
 * The merit a new Grow layers request grows on unless told: the smooth merit, which keeps growing
 * where the one-sided mask merit stalls (e.g. a single quarter wave against 400–900 nm). Jobs queued
 * without the field keep the engine's own default, so they grow what they grew.
 */
export const DEFAULT_GROW_REQUEST_MERIT: GrowthMerit = 'smooth';

/**
 * Limits of an optimisation request; they keep one job within what a queue worker finishes in
 * minutes and catch typing slips (common practice, no source). The most trials and the largest
 * seed are the engine's.
 */
export const OPTIMISE_LIMITS = {
  /** Largest thickness bound, nm: the Layer grid's largest layer. */
  thicknessBoundMaxNm: 100_000,
  maxIterations: 1000,
  maxLayers: 200,
  maxTotalThicknessNm: 1_000_000,
  maxSteps: 200,
  /** Most materials Grow layers may choose from. */
  allowedMaterials: 8,
  /** Most needles Grow layers inserts in one step. */
  needlesPerStep: 10,
  trials: MAX_TRIALS,
  seed: MAX_SEED,
  thicknessErrorPercent: 50,
  thicknessErrorNm: 100,
  rateErrorPercent: 50,
  indexErrorPercent: 20,
} as const;

const L = OPTIMISE_LIMITS;

/** A whole number from `min` to `max`, with one message for every way of missing it. */
function wholeNumberFrom(what: string, min: number, max: number) {
  const message = `${what} must be a whole number from ${min} to ${max}`;
  return finiteNumber(message)
    .int({ error: message })
    .min(min, { error: message })
    .max(max, { error: message });
}

/** A number from 0 to `max` (unit after the number, e.g. ' nm'). */
function numberFromZero(what: string, max: number, unit: string) {
  const message = `${what} must be a number from 0 to ${max}${unit}`;
  return finiteNumber(message).min(0, { error: message }).max(max, { error: message });
}

/** A number above 0 and at most `max`. */
function numberAboveZero(what: string, max: number, unit: string) {
  const message = `${what} must be a number above 0 and at most ${max}${unit}`;
  return finiteNumber(message).gt(0, { error: message }).max(max, { error: message });
}

/**
 * Most layers of a grown design; a form passes the version's layer count as `lowest` (Grow layers
 * only adds layers).
 */
export function maxLayersField(lowest = 1) {
  return wholeNumberFrom('Max layers', lowest, L.maxLayers);
}

const specMaskId = recordId('Choose a spec mask').optional();

/** Thickness bounds, target margin and iterations: what Fit to mask and Grow layers both take. */
const fitShape = {
  /** Defaults to the design's own spec mask. */
  specMaskId,
  minThicknessNm: numberFromZero('Min thickness', L.thicknessBoundMaxNm, ' nm').default(
    DEFAULT_MIN_THICKNESS_NM,
  ),
  maxThicknessNm: numberAboveZero('Max thickness', L.thicknessBoundMaxNm, ' nm').default(
    DEFAULT_MAX_THICKNESS_NM,
  ),
  maxIterations: wholeNumberFrom('Max iterations', 1, L.maxIterations).default(DEFAULT_MAX_ITERATIONS),
  /** Missing: the shop's default target margin. */
  targetMarginPercent: targetMarginPercentField.optional(),
};

/** The max thickness may not be below the min thickness: refused at the max. */
export function checkThicknessBounds(
  value: { minThicknessNm: number; maxThicknessNm: number },
  ctx: z.RefinementCtx,
): void {
  if (value.minThicknessNm > value.maxThicknessNm)
    ctx.addIssue({
      code: 'custom',
      path: ['maxThicknessNm'],
      message: `Max thickness must not be below min thickness (${value.minThicknessNm} nm)`,
    });
}

/** Fit to mask: Levenberg–Marquardt over the unlocked layers' thicknesses. */
export const fitRequestSchema = z.strictObject(fitShape).superRefine(checkThicknessBounds);
export type FitRequest = z.output<typeof fitRequestSchema>;

const materialIds = (message: string) =>
  z
    .array(recordId(message), { error: message })
    .max(L.allowedMaterials, { error: `Choose at most ${L.allowedMaterials} materials` });

const PLACEMENT_FIELDS = ['outermostOnlyMaterialIds', 'nextToSubstrateMaterialIds'] as const;

/** Grow layers: needle synthesis from the version's stack with the allowed materials. */
export const growRequestSchema = z
  .strictObject({
    ...fitShape,
    // Grow layers refines with the engine's own iterations; the field is accepted as it always was.
    maxIterations: fitShape.maxIterations.unwrap().optional(),
    allowedMaterialIds: materialIds('Choose the allowed materials from the library').min(1, {
      error: 'Choose at least one material',
    }),
    /** Allowed materials that may only be the outermost layer (e.g. a fluoride on top). */
    outermostOnlyMaterialIds: materialIds(
      'Choose outermost-only materials among the allowed ones',
    ).optional(),
    /** The only allowed materials a new layer next to the substrate may be. */
    nextToSubstrateMaterialIds: materialIds(
      'Choose the materials next to the substrate among the allowed ones',
    ).optional(),
    maxLayers: maxLayersField().default(DEFAULT_MAX_LAYERS),
    maxTotalThicknessNm: numberAboveZero('Max total thickness', L.maxTotalThicknessNm, ' nm').default(
      DEFAULT_MAX_TOTAL_THICKNESS_NM,
    ),
    maxSteps: wholeNumberFrom('Max steps', 1, L.maxSteps).default(DEFAULT_MAX_STEPS),
    /**
     * `smooth`: grow towards R = 0 under every maximum, fitting each step to the mask; `mask`: grow
     * on the one-sided mask merit (fewer layers on some narrow bands, stalls on wide ones).
     */
    growthMerit: z
      .enum(GROWTH_MERITS, { error: `Grow on must be ${GROWTH_MERITS.join(' or ')}` })
      .default(DEFAULT_GROW_REQUEST_MERIT),
    needlesPerStep: wholeNumberFrom('Needles per step', 1, L.needlesPerStep).default(
      DEFAULT_NEEDLES_PER_STEP,
    ),
  })
  .superRefine((value, ctx) => {
    checkThicknessBounds(value, ctx);
    for (const field of PLACEMENT_FIELDS)
      value[field]?.forEach((id, index) => {
        if (!value.allowedMaterialIds.includes(id))
          ctx.addIssue({
            code: 'custom',
            path: [field, index],
            message: 'This material is not among the allowed materials',
          });
      });
  });
export type GrowRequest = z.output<typeof growRequestSchema>;

/** Thickness error of every layer, drawn per trial. */
export const thicknessErrorSchema = z.strictObject(
  {
    relativePercent: numberFromZero('The thickness error', L.thicknessErrorPercent, ' %').optional(),
    absoluteNm: numberFromZero('The thickness error', L.thicknessErrorNm, ' nm').optional(),
    distribution: z
      .enum(ERROR_DISTRIBUTIONS, { error: 'The error distribution must be normal or uniform' })
      .optional(),
  },
  {
    error: (issue) =>
      issue.code === 'invalid_type' ? 'thickness must be an object with the thickness error' : undefined,
  },
);

/** Yield forecast: seeded Monte Carlo of thickness (and index) errors against the mask. */
export const yieldRequestSchema = z.strictObject({
  specMaskId,
  trials: wholeNumberFrom('Trials', 1, L.trials).default(DEFAULT_TRIALS),
  seed: wholeNumberFrom('The seed', 0, L.seed).default(DEFAULT_SEED),
  thickness: thicknessErrorSchema,
  /** Systematic (rate calibration) error shared by all layers of a material, percent. */
  systematicPercent: numberFromZero('The rate error', L.rateErrorPercent, ' %').optional(),
  /** Index error per material, percent. */
  indexPercent: numberFromZero('The index error', L.indexErrorPercent, ' %').optional(),
});
export type YieldRequest = z.output<typeof yieldRequestSchema>;

const FACTOR_RANGE_MESSAGE = 'factorRange must be [lowest, highest] thickness factor';

/** Lowest and highest thickness factor a layer of the run may have had. */
export const factorRangeSchema = z
  .tuple(
    [
      finiteNumber('The lowest factor must be a number above 0').gt(0, {
        error: 'The lowest factor must be a number above 0',
      }),
      finiteNumber('The highest factor must be a number'),
    ],
    { error: FACTOR_RANGE_MESSAGE },
  )
  .superRefine(([low, high], ctx) => {
    if (!(high > low))
      ctx.addIssue({
        code: 'custom',
        path: [1],
        message: 'The highest factor must exceed the lowest factor',
      });
  });

/** Run diagnosis: which layers of a run most likely deviated, from its measured spectrum. */
export const diagnosisRequestSchema = z.strictObject({
  factorRange: factorRangeSchema.default([...DEFAULT_FACTOR_RANGE]),
});
export type DiagnosisRequest = z.output<typeof diagnosisRequestSchema>;

const STEP_MESSAGE = "step must be the number of one of the result's steps";

/** A Fit to mask or Grow layers result becomes a new draft version. */
export const acceptRequestSchema = z.strictObject({
  /** For Grow layers: which step's stack becomes the new version (default the final one). */
  step: finiteNumber(STEP_MESSAGE).int({ error: STEP_MESSAGE }).min(0, { error: STEP_MESSAGE }).optional(),
});
export type AcceptRequest = z.output<typeof acceptRequestSchema>;
