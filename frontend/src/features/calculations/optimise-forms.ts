/*
 * The optimisation forms' values checked by the API's own request schemas: the fields are typed
 * text, parsed here and then held to the same limits, defaults and messages as the API, so a
 * request the API would refuse is stopped where it is typed.
 */
import {
  DEFAULT_FACTOR_RANGE,
  DEFAULT_GROW_REQUEST_MERIT,
  DEFAULT_NEEDLES_PER_STEP,
  DEFAULT_MAX_ITERATIONS,
  DEFAULT_MAX_LAYERS,
  DEFAULT_MAX_STEPS,
  DEFAULT_MAX_THICKNESS_NM,
  DEFAULT_MAX_TOTAL_THICKNESS_NM,
  DEFAULT_MIN_THICKNESS_NM,
  DEFAULT_SEED,
  DEFAULT_TARGET_MARGIN_PERCENT,
  DEFAULT_TRIALS,
  checkThicknessBounds,
  factorRangeSchema,
  fitRequestSchema,
  growRequestSchema,
  maxLayersField,
  thicknessErrorSchema,
  yieldRequestSchema,
  type ErrorDistribution,
  type GrowthMerit,
} from '@quietglass/shared';
import { z } from 'zod';
import { typedNumber } from '../../lib/validation';

const { shape: fit } = fitRequestSchema;

/** The form's starting text for the target margin, until the shop's default has loaded. */
const DEFAULT_TARGET_MARGIN_TEXT = String(DEFAULT_TARGET_MARGIN_PERCENT);

/** Thickness bounds and target margin, shared by the Fit to mask and Grow layers forms. */
const boundsFields = {
  minThicknessNm: typedNumber.pipe(fit.minThicknessNm.unwrap()),
  maxThicknessNm: typedNumber.pipe(fit.maxThicknessNm.unwrap()),
  targetMarginPercent: typedNumber.pipe(fit.targetMarginPercent.unwrap()),
};

export interface FitValues {
  minThicknessNm: string;
  maxThicknessNm: string;
  maxIterations: string;
  targetMarginPercent: string;
}

export const FIT_DEFAULTS: FitValues = {
  minThicknessNm: String(DEFAULT_MIN_THICKNESS_NM),
  maxThicknessNm: String(DEFAULT_MAX_THICKNESS_NM),
  maxIterations: String(DEFAULT_MAX_ITERATIONS),
  targetMarginPercent: DEFAULT_TARGET_MARGIN_TEXT,
};

export const fitFormSchema = z
  .object({ ...boundsFields, maxIterations: typedNumber.pipe(fit.maxIterations.unwrap()) })
  .superRefine(checkThicknessBounds);
export type FitFormOutput = z.output<typeof fitFormSchema>;

export interface GrowValues {
  allowedMaterialIds: number[];
  outermostOnlyMaterialIds: number[];
  nextToSubstrateMaterialIds: number[];
  maxLayers: string;
  maxTotalThicknessNm: string;
  minThicknessNm: string;
  maxThicknessNm: string;
  maxSteps: string;
  targetMarginPercent: string;
  growthMerit: GrowthMerit;
  needlesPerStep: string;
}

/** The Grow layers form's first values: the version's materials ticked, at least its layer count. */
export function growDefaults(allowedMaterialIds: number[], layerCount: number): GrowValues {
  return {
    allowedMaterialIds,
    outermostOnlyMaterialIds: [],
    nextToSubstrateMaterialIds: [],
    maxLayers: String(Math.max(DEFAULT_MAX_LAYERS, layerCount)),
    maxTotalThicknessNm: String(DEFAULT_MAX_TOTAL_THICKNESS_NM),
    minThicknessNm: String(DEFAULT_MIN_THICKNESS_NM),
    maxThicknessNm: String(DEFAULT_MAX_THICKNESS_NM),
    maxSteps: String(DEFAULT_MAX_STEPS),
    targetMarginPercent: DEFAULT_TARGET_MARGIN_TEXT,
    growthMerit: DEFAULT_GROW_REQUEST_MERIT,
    needlesPerStep: String(DEFAULT_NEEDLES_PER_STEP),
  };
}

/**
 * The Grow layers form of a version with `layerCount` layers (the most layers may not be below
 * it). Placement rules are kept only for materials still allowed, and left out when none is ticked.
 */
export function growFormSchema(layerCount: number) {
  const { shape: grow } = growRequestSchema;
  return z
    .object({
      ...boundsFields,
      allowedMaterialIds: grow.allowedMaterialIds,
      outermostOnlyMaterialIds: z.array(z.number()),
      nextToSubstrateMaterialIds: z.array(z.number()),
      maxLayers: typedNumber.pipe(maxLayersField(Math.max(1, layerCount))),
      maxTotalThicknessNm: typedNumber.pipe(grow.maxTotalThicknessNm.unwrap()),
      maxSteps: typedNumber.pipe(grow.maxSteps.unwrap()),
      growthMerit: grow.growthMerit.unwrap(),
      needlesPerStep: typedNumber.pipe(grow.needlesPerStep.unwrap()),
    })
    .superRefine(checkThicknessBounds)
    .transform(({ outermostOnlyMaterialIds, nextToSubstrateMaterialIds, ...rest }) => {
      const keep = (ids: number[]) => ids.filter((id) => rest.allowedMaterialIds.includes(id));
      const outer = keep(outermostOnlyMaterialIds);
      const bottom = keep(nextToSubstrateMaterialIds);
      return {
        ...rest,
        ...(outer.length > 0 ? { outermostOnlyMaterialIds: outer } : {}),
        ...(bottom.length > 0 ? { nextToSubstrateMaterialIds: bottom } : {}),
      };
    });
}
export type GrowFormOutput = z.output<ReturnType<typeof growFormSchema>>;

export interface YieldValues {
  trials: string;
  seed: string;
  relativePercent: string;
  absoluteNm: string;
  distribution: ErrorDistribution;
  systematicPercent: string;
  indexPercent: string;
}

export const YIELD_DEFAULTS: YieldValues = {
  trials: String(DEFAULT_TRIALS),
  seed: String(DEFAULT_SEED),
  relativePercent: '1',
  absoluteNm: '0',
  distribution: 'normal',
  systematicPercent: '0',
  indexPercent: '0',
};

const { shape: forecast } = yieldRequestSchema;
const { shape: thickness } = thicknessErrorSchema;

/** The Yield forecast form: flat fields, sent with the thickness error as one object. */
export const yieldFormSchema = z
  .object({
    trials: typedNumber.pipe(forecast.trials.unwrap()),
    seed: typedNumber.pipe(forecast.seed.unwrap()),
    relativePercent: typedNumber.pipe(thickness.relativePercent.unwrap()),
    absoluteNm: typedNumber.pipe(thickness.absoluteNm.unwrap()),
    distribution: thickness.distribution.unwrap(),
    systematicPercent: typedNumber.pipe(forecast.systematicPercent.unwrap()),
    indexPercent: typedNumber.pipe(forecast.indexPercent.unwrap()),
  })
  .transform(({ relativePercent, absoluteNm, distribution, ...rest }) => ({
    ...rest,
    thickness: { relativePercent, absoluteNm, distribution },
  }));
export type YieldFormOutput = z.output<typeof yieldFormSchema>;

/** The Run diagnosis form: lowest and highest thickness factor as typed. */
export interface DiagnosisValues {
  factorRange: [string, string];
}

export const DIAGNOSIS_DEFAULTS: DiagnosisValues = {
  factorRange: [String(DEFAULT_FACTOR_RANGE[0]), String(DEFAULT_FACTOR_RANGE[1])],
};

export const diagnosisFormSchema = z.object({
  factorRange: z.tuple([typedNumber, typedNumber]).pipe(factorRangeSchema),
});
