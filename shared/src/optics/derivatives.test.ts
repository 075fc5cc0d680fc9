/*
 * Checks of the analytic thickness derivatives and needle function against central differences of
 * computeSpectrum (the characteristic-matrix method, Macleod, Thin-Film Optical Filters, ch. 2; the
 * needle function of A. V. Tikhonravov, M. K. Trubetskov, G. W. DeBell, Appl. Opt. 35, 5493 (1996)).
 */
import { describe, expect, it } from 'vitest';
import {
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  setLayerThicknesses,
  type Polarisation,
} from './batch.js';
import { computeThicknessDerivatives, createThicknessDerivatives } from './derivatives.js';
import { constantIndex } from './dispersion.js';
import type { OpticalStack } from './stack.js';
import { randomLayers, seededRandom } from './__tests__/random.js';

function randomStack(seed: number): OpticalStack {
  const rand = seededRandom(seed);
  const layers = randomLayers(rand, { absorbing: 0.5, maxK: 0.5, maxLayers: 8, substrateK: 0 });
  return {
    incident: constantIndex(1 + 0.6 * rand()),
    layers: layers.map((l) => ({ material: constantIndex(l.n, l.k), thicknessNm: 5 + l.thicknessNm })),
    substrate: constantIndex(1.3 + rand(), rand() < 0.5 ? 0.2 * rand() : 0),
    backLayers: [],
    exit: constantIndex(1),
  };
}

/** Central difference (f(d + h) − f(d − h))/2h, h = 1e-4 nm: truncation error ~h², far below 1e-7. */
function centralDifferences(stack: OpticalStack, grid: Parameters<typeof createSpectrumPlan>[1]) {
  const plan = createSpectrumPlan(stack, grid);
  const out = createSpectrumOutput(plan);
  const L = stack.layers.length;
  const base = stack.layers.map((l) => l.thicknessNm);
  const dR = new Float64Array(L * plan.size);
  const dT = new Float64Array(L * plan.size);
  const h = 1e-4;
  for (let l = 0; l < L; l++) {
    const d = [...base];
    d[l] = base[l] + h;
    setLayerThicknesses(plan, d);
    computeSpectrum(out, plan);
    const Rp = Float64Array.from(out.R);
    const Tp = Float64Array.from(out.T);
    d[l] = base[l] - h;
    setLayerThicknesses(plan, d);
    computeSpectrum(out, plan);
    for (let i = 0; i < plan.size; i++) {
      dR[l * plan.size + i] = (Rp[i] - out.R[i]) / (2 * h);
      dT[l * plan.size + i] = (Tp[i] - out.T[i]) / (2 * h);
    }
  }
  return { dR, dT };
}

describe('analytic thickness derivatives', () => {
  const polarisations: Polarisation[] = ['s', 'p', 'avg'];
  it.each([1, 2, 3, 4, 5, 6, 7, 8])('match central differences on random absorbing stack %i, oblique s, p', (seed) => {
    const stack = randomStack(seed);
    const grid = { wavelengthsNm: [420, 555.5, 910], anglesDeg: [0, 37, 71], polarisations };
    const plan = createSpectrumPlan(stack, grid);
    const analytic = computeThicknessDerivatives(createThicknessDerivatives(plan), plan);
    const numeric = centralDifferences(stack, grid);
    let scale = 0;
    for (const v of numeric.dR) scale = Math.max(scale, Math.abs(v));
    for (const v of numeric.dT) scale = Math.max(scale, Math.abs(v));
    for (let i = 0; i < numeric.dR.length; i++) {
      // Relative to the largest derivative of the case: a central difference's rounding noise
      // (~1e-16/h) swamps single tiny entries.
      expect(Math.abs(analytic.dR[i] - numeric.dR[i])).toBeLessThan(1e-7 * scale);
      expect(Math.abs(analytic.dT[i] - numeric.dT[i])).toBeLessThan(1e-7 * scale);
    }
    expect(scale).toBeGreaterThan(1e-5);
  });
});
