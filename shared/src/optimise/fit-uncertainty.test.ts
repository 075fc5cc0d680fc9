import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { responseAt } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import type { OpticalStack } from '../optics/stack.js';
import { fitToMask } from './fit.js';
import { createMaskMerit } from './merit.js';
import { thicknessUncertainty } from './fit-uncertainty.js';
import { Mulberry32, fillDeviates } from './random.js';

const WAVELENGTHS = Array.from({ length: 81 }, (_, i) => 400 + 5 * i);
const NOISE_PERCENT = 0.05;

function stack(thicknessesNm: number[]): OpticalStack {
  return {
    incident: c(1),
    layers: [
      { material: c(1.38), thicknessNm: elementAt(thicknessesNm, 0, 'thicknesses') },
      { material: c(2.05), thicknessNm: elementAt(thicknessesNm, 1, 'thicknesses') },
    ],
    substrate: c(1.52),
    backLayers: [],
    exit: c(1),
  };
}

const band = { from_nm: 400, to_nm: 800, quantity: 'R' as const, max_percent: 100, step_nm: 400 };

describe('thicknessUncertainty', () => {
  // Monte Carlo check of the linearised covariance (Press et al., Numerical Recipes, 3rd ed.,
  // §15.6: the spread of fits to synthetic data sets drawn with the same noise estimates the
  // parameters' standard errors): fit 40 noisy spectra of a known two-layer stack, compare the
  // spread of the fitted thicknesses with the σ the fit states.
  it('states σ that matches the scatter of refits to noisy spectra (within 35 %)', () => {
    const truth = [99.6, 67.1];
    const clean = WAVELENGTHS.map((w) => 100 * responseAt(stack(truth), w, 0, 'avg').R);
    const trials = 40;
    const noise = fillDeviates(
      new Float64Array(trials * WAVELENGTHS.length),
      trials * WAVELENGTHS.length,
      new Mulberry32(9),
      'normal',
    );
    const fitted: number[][] = [];
    const stated: number[][] = [];
    for (let t = 0; t < trials; t++) {
      const measured = clean.map(
        (v, i) => v + NOISE_PERCENT * elementAt(noise, t * WAVELENGTHS.length + i, 'noise'),
      );
      const targets = [{ quantity: 'R' as const, wavelengthsNm: WAVELENGTHS, valuesPercent: measured }];
      const start = stack([elementAt(truth, 0, 'truth') * 1.05, elementAt(truth, 1, 'truth') * 0.95]);
      const fit = fitToMask(start, { bands: [band] }, { targets, maxIterations: 200, minThicknessNm: 1 });
      const merit = createMaskMerit(stack(fit.thicknessesNm), { bands: [band] }, { targets });
      const u = thicknessUncertainty(merit, fit.thicknessesNm, WAVELENGTHS.length);
      fitted.push(fit.thicknessesNm);
      stated.push(u.sigmaNm.map((s) => s ?? NaN));
      // The residual scale recovers the added noise (s ≈ σ_noise on a unit-weight target).
      expect(u.residualScale).toBeGreaterThan(NOISE_PERCENT * 0.7);
      expect(u.residualScale).toBeLessThan(NOISE_PERCENT * 1.3);
    }
    for (const j of [0, 1]) {
      const mean = fitted.reduce((s, f) => s + elementAt(f, j, 'fitted thicknesses'), 0) / trials;
      const spread = Math.sqrt(
        fitted.reduce((s, f) => s + (elementAt(f, j, 'fitted thicknesses') - mean) ** 2, 0) / (trials - 1),
      );
      const meanStated = stated.reduce((s, f) => s + elementAt(f, j, 'stated σ'), 0) / trials;
      expect(meanStated / spread).toBeGreaterThan(0.65);
      expect(meanStated / spread).toBeLessThan(1.35);
      expect(Math.abs(mean - elementAt(truth, j, 'truth'))).toBeLessThan(3 * meanStated);
    }
  });

  it('gives a thin layer a much larger relative σ than a thick one', () => {
    const thin = [99.6, 2];
    const values = WAVELENGTHS.map((w) => 100 * responseAt(stack(thin), w, 0, 'avg').R);
    const noise = fillDeviates(
      new Float64Array(WAVELENGTHS.length),
      WAVELENGTHS.length,
      new Mulberry32(4),
      'normal',
    );
    const targets = [
      {
        quantity: 'R' as const,
        wavelengthsNm: WAVELENGTHS,
        valuesPercent: values.map((v, i) => v + NOISE_PERCENT * elementAt(noise, i, 'noise')),
      },
    ];
    const merit = createMaskMerit(stack(thin), { bands: [band] }, { targets });
    const u = thicknessUncertainty(merit, thin, WAVELENGTHS.length);
    expect(u.sigmaNm[1]! / elementAt(thin, 1, 'thicknesses')).toBeGreaterThan(
      10 * (u.sigmaNm[0]! / elementAt(thin, 0, 'thicknesses')),
    );
  });

  it('refuses a fit with no more samples than layers', () => {
    const targets = [{ quantity: 'R' as const, wavelengthsNm: [500, 600], valuesPercent: [1, 1] }];
    const merit = createMaskMerit(stack([100, 60]), { bands: [band] }, { targets });
    expect(() => thicknessUncertainty(merit, [100, 60], 2)).toThrow(OpticsInputError);
  });
});
