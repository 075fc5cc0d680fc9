/*
 * The yield forecast beside an optimiser's result: a short Monte Carlo of the result stack under a
 * fixed, stated thickness error, so the engineer sees at once whether the margin designed in
 * survives ordinary deposition scatter. A full study (more trials, systematic and index errors,
 * sensitivity ranking) is the Yield forecast job.
 */
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import type { BackSurface } from '../optics/batch.js';
import { forecastYield } from './yield.js';

/**
 * Trials and error model of the result forecast: 500 trials of a 1 % (1σ, normal) relative
 * thickness error per layer, independent layer to layer — a typical run-to-run scatter of
 * crystal-monitored evaporation (common practice, no source). 500 trials give the yield to about
 * ±2 percentage points (binomial standard error √(p(1−p)/n) ≤ 0.5/√500 ≈ 2.2 %).
 */
export const RESULT_FORECAST = { trials: 500, relativePercent: 1, seed: 1 } as const;

export interface ResultForecast {
  /** Trials run (fewer than `requestedTrials` when the job was cancelled during the forecast). */
  trials: number;
  requestedTrials: number;
  /** Relative thickness error per layer, percent, 1σ of a normal distribution. */
  relativePercent: number;
  /** Fraction of trials that meet the mask (0–1). */
  yieldFraction: number;
  /** Median and 5th percentile of the trials' worst margins, percentage points. */
  medianWorstMargin: number;
  p5WorstMargin: number;
}

/**
 * The result forecast of a stack; `onProgress(fraction)` returning false stops it (the trials so
 * far are kept). Null when the stack has no layers to perturb.
 */
export function forecastResult(
  stack: OpticalStack,
  mask: SpecMask,
  back: BackSurface,
  onProgress?: (fraction: number) => boolean | void,
): ResultForecast | null {
  if (stack.layers.length === 0) return null;
  const f = forecastYield(stack, mask, {
    trials: RESULT_FORECAST.trials,
    seed: RESULT_FORECAST.seed,
    thickness: { relativePercent: RESULT_FORECAST.relativePercent, distribution: 'normal' },
    percentiles: [5, 50],
    envelopeTrials: 0,
    sensitivityTrials: 0,
    back,
    onProgress,
  });
  const at = (p: number) => f.worstMargins.percentiles.find((x) => x.p === p)?.value ?? NaN;
  return {
    trials: f.trials,
    requestedTrials: f.requestedTrials,
    relativePercent: RESULT_FORECAST.relativePercent,
    yieldFraction: f.yieldFraction,
    medianWorstMargin: at(50),
    p5WorstMargin: at(5),
  };
}
