import { describe, expect, it } from 'vitest';
import { constantIndex as c } from '../optics/dispersion.js';
import type { OpticalStack } from '../optics/stack.js';
import { RESULT_FORECAST, forecastResult } from './result-forecast.js';

/*
 * A single film at normal incidence: R = (r1² + r2² + 2r1r2·cos 2δ) / (1 + r1²r2² + 2r1r2·cos 2δ),
 * δ = 2π·n·d/λ, r1, r2 the Fresnel coefficients of its two faces (H. A. Macleod, Thin-Film Optical
 * Filters, 4th ed., §2.6.1; M. Born and E. Wolf, Principles of Optics, §1.6.4). A quarter wave sits
 * at the minimum and R is even in the relative thickness error t there (2δ = π(1 + t)). With the
 * limit set to R at t = 1 % and a 1 % (1σ) normal error, a trial passes when |z| ≤ 1: the yield is
 * P(|Z| ≤ 1) = 0.6827 (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
 * Table 26.1). Indices 1.38 on 1.52 are invented for the check.
 */
const N_FILM = 1.38;
const N_GLASS = 1.52;
const LAMBDA = 550;
const quarter = LAMBDA / (4 * N_FILM);

function singleFilmR(t: number): number {
  const r1 = (1 - N_FILM) / (1 + N_FILM);
  const r2 = (N_FILM - N_GLASS) / (N_FILM + N_GLASS);
  const cos2d = Math.cos(Math.PI * (1 + t));
  return (r1 ** 2 + r2 ** 2 + 2 * r1 * r2 * cos2d) / (1 + r1 ** 2 * r2 ** 2 + 2 * r1 * r2 * cos2d);
}

const stack: OpticalStack = {
  incident: c(1),
  layers: [{ material: c(N_FILM), thicknessNm: quarter }],
  substrate: c(N_GLASS),
  backLayers: [],
  exit: c(1),
};
const limitPercent = 100 * singleFilmR(0.01);
const mask = {
  bands: [
    {
      from_nm: LAMBDA,
      to_nm: LAMBDA + 0.01,
      quantity: 'R' as const,
      max_percent: limitPercent,
      step_nm: 0.01,
    },
  ],
};

describe('forecastResult', () => {
  it('gives the normal-table yield of a quarter wave whose limit sits at a 1σ thickness error', () => {
    const f = forecastResult(stack, mask, 'none')!;
    expect(f.trials).toBe(RESULT_FORECAST.trials);
    expect(f.relativePercent).toBe(1);
    // Binomial standard error √(p(1−p)/n) = 0.0208 at n = 500: within 4 of them.
    const se = Math.sqrt((0.6827 * (1 - 0.6827)) / f.trials);
    expect(Math.abs(f.yieldFraction - 0.6827)).toBeLessThan(4 * se);
    // Half the trials lie within |z| ≤ 0.6745 (the normal quartile, same table): the median worst
    // margin is the limit minus R there: between |z| 0.57 and 0.78 for 500 trials.
    expect(f.medianWorstMargin).toBeGreaterThan(limitPercent - 100 * singleFilmR(0.0078));
    expect(f.medianWorstMargin).toBeLessThan(limitPercent - 100 * singleFilmR(0.0057));
    expect(f.p5WorstMargin).toBeLessThan(0);
  });

  it('stops when asked and keeps only the trials run', () => {
    let calls = 0;
    const f = forecastResult(stack, mask, 'none', () => ++calls < 1)!;
    expect(f.trials).toBeLessThan(RESULT_FORECAST.trials);
    expect(f.requestedTrials).toBe(RESULT_FORECAST.trials);
  });

  it('has nothing to forecast for a stack without layers', () => {
    expect(forecastResult({ ...stack, layers: [] }, mask, 'none')).toBeNull();
  });
});
