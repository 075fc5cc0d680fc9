/*
 * Inputs and results of the optimisation jobs of the compute queue (Fit to mask, Grow layers, Yield
 * forecast, Run diagnosis): plain JSON, so they are stored with the calculation and cross into a
 * worker thread unchanged. `runOptimiseJob` is what the thread runs.
 */
import { maskSamples, type JobSize } from '@quietglass/shared/budgets';
import type { DiagnosisResult } from '@quietglass/shared/calculations';
import {
  growLayers,
  type AllowedMaterial,
  type GrowResult,
  type GrowthMerit,
} from '@quietglass/shared/optimise/needle';
import { fitToMask, type FitResult } from '@quietglass/shared/optimise/fit';
import { diagnoseRun } from '@quietglass/shared/optimise/diagnosis';
import { forecastResult } from '@quietglass/shared/optimise/result-forecast';
import type { YieldOptions } from '@quietglass/shared/optimise/yield';
import type { LimitBand, SpecMask } from '@quietglass/shared/optics/mask';
import type { BackSurface } from '@quietglass/shared/optics/batch';
import { parseStack, type OpticalStack, type StackDescription } from '@quietglass/shared/optics/stack';
import { elementAt } from '@quietglass/shared/checked';

export type OptimiseKind = 'fit' | 'grow' | 'yield' | 'diagnosis';

/** Iterations of the Run diagnosis fit. */
const DIAGNOSIS_ITERATIONS = 200;

interface Base {
  stack: StackDescription;
  back: 'none' | 'incoherent';
  bands: LimitBand[];
  /** Material id of each front layer (incident side first), to turn a result into a version. */
  layerMaterialIds: number[];
}

export interface FitInput extends Base {
  kind: 'fit';
  options: {
    locked: boolean[];
    minThicknessNm: number;
    maxThicknessNm: number;
    maxIterations: number;
    /** Target margin, percentage points (the engine's small default when absent). */
    marginPercent?: number;
  };
}

export interface GrowInput extends Base {
  kind: 'grow';
  allowed: (AllowedMaterial & { materialId: number })[];
  options: {
    maxLayers: number;
    maxTotalThicknessNm: number;
    minThicknessNm: number;
    maxSteps: number;
    marginPercent?: number;
    /** Absent in jobs queued before the choice existed: the engine's default. */
    growthMerit?: GrowthMerit;
    needlesPerStep?: number;
    /** Material names (of `allowed`) that may only be outermost / the only ones next to the substrate. */
    outermostOnly?: string[];
    nextToSubstrate?: string[];
  };
}

export interface YieldInput extends Base {
  kind: 'yield';
  layerMaterials: string[];
  options: Pick<YieldOptions, 'trials' | 'seed' | 'thickness' | 'systematic' | 'indexErrors'>;
}

export interface DiagnosisInput extends Base {
  kind: 'diagnosis';
  measured: { quantity: 'R' | 'T'; angleDeg: number; wavelengthsNm: number[]; valuesPercent: number[] };
  /** How far a layer may have deviated: thickness factor bounds. */
  factorRange: [number, number];
}

export type OptimiseInput = FitInput | GrowInput | YieldInput | DiagnosisInput;

export type ProgressMessage = {
  type: 'progress';
  fraction: number;
  merit?: number;
  iteration?: number;
  layerCount?: number;
};

/** Runs a fit, grow or diagnosis (yield uses its own thread pool). `report` may return false to stop. */
export function runOptimiseJob(
  input: FitInput | GrowInput | DiagnosisInput,
  report: (p: ProgressMessage) => boolean,
): FitResult | GrowResult | DiagnosisResult {
  const stack = parseStack(input.stack);
  const mask = { bands: input.bands };
  if (input.kind === 'fit') {
    const max = input.options.maxIterations;
    const fit = fitToMask(stack, mask, {
      back: input.back,
      locked: input.options.locked,
      minThicknessNm: input.options.minThicknessNm,
      maxThicknessNm: input.options.maxThicknessNm,
      maxIterations: max,
      marginPercent: input.options.marginPercent,
      onIteration: (it) =>
        report({
          type: 'progress',
          fraction: Math.min(0.99, it.iteration / max),
          merit: it.merit,
          iteration: it.iteration,
        }),
    });
    if (fit.stoppedBy === 'cancelled') return fit;
    const fitted = {
      ...stack,
      layers: stack.layers.map((l, i) => ({
        ...l,
        thicknessNm: elementAt(fit.thicknessesNm, i, 'the fitted thicknesses'),
      })),
    };
    return { ...fit, forecast: resultForecast(fitted, mask, input.back, report) };
  }
  if (input.kind === 'grow') {
    const max = input.options.maxSteps;
    const grown = growLayers(stack, mask, {
      back: input.back,
      allowedMaterials: input.allowed.map(({ name, model }) => ({ name, model })),
      maxLayers: input.options.maxLayers,
      maxTotalThicknessNm: input.options.maxTotalThicknessNm,
      minThicknessNm: input.options.minThicknessNm,
      maxSteps: max,
      marginPercent: input.options.marginPercent,
      outermostOnly: input.options.outermostOnly,
      nextToSubstrate: input.options.nextToSubstrate,
      growthMerit: input.options.growthMerit,
      needlesPerStep: input.options.needlesPerStep,
      onStep: (step) =>
        report({
          type: 'progress',
          fraction: Math.min(0.99, step.step / max),
          merit: step.merit,
          layerCount: step.layerCount,
        }),
    });
    if (grown.stoppedBy === 'cancelled') return grown;
    return { ...grown, forecast: resultForecast(grown.stack, mask, input.back, report) };
  }
  // Run diagnosis: the thicknesses that reproduce the measured spectrum, each within its factor range.
  return diagnoseRun(stack, mask, input.measured, input.layerMaterialIds, {
    back: input.back,
    factorRange: input.factorRange,
    maxIterations: DIAGNOSIS_ITERATIONS,
    onIteration: (it) =>
      report({
        type: 'progress',
        fraction: Math.min(0.99, it.iteration / DIAGNOSIS_ITERATIONS),
        merit: it.merit,
        iteration: it.iteration,
      }),
  });
}

/**
 * The short yield forecast beside a Fit or Grow result (shared/optimise/result-forecast), reported
 * as the last 1 % of the job's progress; a cancel stops it and keeps no forecast.
 */
function resultForecast(
  stack: OpticalStack,
  mask: SpecMask,
  back: BackSurface,
  report: (p: ProgressMessage) => boolean,
) {
  let cancelled = false;
  const forecast = forecastResult(stack, mask, back, (fraction) => {
    cancelled = !report({ type: 'progress', fraction: 0.99 + 0.01 * fraction });
    return !cancelled;
  });
  return cancelled ? null : forecast;
}

/** The size of an optimisation job for its work budget (shared/budgets). */
export function optimiseJobSize(input: OptimiseInput): JobSize {
  const layers = input.stack.layers.length;
  const samples = maskSamples(input.bands);
  if (input.kind === 'fit') return { layers, samples, iterations: input.options.maxIterations };
  if (input.kind === 'grow')
    return { layers, samples, maxLayers: input.options.maxLayers, steps: input.options.maxSteps };
  if (input.kind === 'yield') {
    const trials = input.options.trials ?? 2000;
    return { layers, samples, trials, sensitivityTrials: Math.min(trials, 1000) };
  }
  return { layers, samples: input.measured.wavelengthsNm.length, iterations: DIAGNOSIS_ITERATIONS };
}
