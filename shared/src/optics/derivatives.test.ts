/*
 * Checks of the analytic thickness derivatives and needle function against central differences of
 * computeSpectrum (the characteristic-matrix method, Macleod, Thin-Film Optical Filters, ch. 2; the
 * needle function of A. V. Tikhonravov, M. K. Trubetskov, G. W. DeBell, Appl. Opt. 35, 5493 (1996)).
 */
import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import {
  calculateSpectrum,
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  setLayerThicknesses,
  type Polarisation,
} from './batch.js';
import {
  computeThicknessDerivatives,
  createNeedleGrid,
  createThicknessDerivatives,
  needleFunction,
} from './derivatives.js';
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
    const d0 = elementAt(base, l, 'thicknesses');
    d[l] = d0 + h;
    setLayerThicknesses(plan, d);
    computeSpectrum(out, plan);
    const Rp = Float64Array.from(out.R);
    const Tp = Float64Array.from(out.T);
    d[l] = d0 - h;
    setLayerThicknesses(plan, d);
    computeSpectrum(out, plan);
    for (let i = 0; i < plan.size; i++) {
      dR[l * plan.size + i] = (elementAt(Rp, i, 'R(d + h)') - elementAt(out.R, i, 'R(d − h)')) / (2 * h);
      dT[l * plan.size + i] = (elementAt(Tp, i, 'T(d + h)') - elementAt(out.T, i, 'T(d − h)')) / (2 * h);
    }
  }
  return { dR, dT };
}

const polarisations: Polarisation[] = ['s', 'p', 'avg'];

describe('analytic thickness derivatives', () => {
  it.each([1, 2, 3, 4, 5, 6, 7, 8])(
    'match central differences on random absorbing stack %i, oblique s, p',
    (seed) => {
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
        const dR = elementAt(analytic.dR, i, 'analytic dR') - elementAt(numeric.dR, i, 'numeric dR');
        const dT = elementAt(analytic.dT, i, 'analytic dT') - elementAt(numeric.dT, i, 'numeric dT');
        expect(Math.abs(dR)).toBeLessThan(1e-7 * scale);
        expect(Math.abs(dT)).toBeLessThan(1e-7 * scale);
      }
      expect(scale).toBeGreaterThan(1e-5);
    },
  );

  // The reduced sweeps are checked against the full ones, which the central differences above hold.
  it.each([1, 2, 3])("without T give the full sweep's ∂R/∂d exactly (random stack %i)", (seed) => {
    const stack = randomStack(seed);
    const grid = { wavelengthsNm: [420, 555.5, 910], anglesDeg: [0, 37, 71], polarisations };
    const plan = createSpectrumPlan(stack, grid);
    const full = computeThicknessDerivatives(createThicknessDerivatives(plan), plan);
    const onlyR = createThicknessDerivatives(plan, { wantT: false });
    expect(onlyR.dT.length).toBe(0);
    computeThicknessDerivatives(onlyR, plan, { wantT: false });
    expect(Array.from(onlyR.dR)).toEqual(Array.from(full.dR));
    expect(full.dR.some((v) => Math.abs(v) > 1e-5)).toBe(true);
  });

  it('give the same values again after thickness changes, and follow ε rewritten in place', () => {
    // Reference: a fresh plan's first sweep, for the same thicknesses and for the changed material.
    const stack = randomStack(6);
    const grid = { wavelengthsNm: [420, 555.5, 910], anglesDeg: [0, 37, 71], polarisations };
    const plan = createSpectrumPlan(stack, grid);
    const out = createThicknessDerivatives(plan);
    computeThicknessDerivatives(out, plan);
    const moved = stack.layers.map((l, i) => l.thicknessNm + 3 * i + 1);
    setLayerThicknesses(plan, moved);
    computeThicknessDerivatives(out, plan);
    const movedStack = {
      ...stack,
      layers: stack.layers.map((l, i) => ({ ...l, thicknessNm: moved[i] ?? 0 })),
    };
    const movedPlan = createSpectrumPlan(movedStack, grid);
    const expected = computeThicknessDerivatives(createThicknessDerivatives(movedPlan), movedPlan);
    expect(Array.from(out.dR)).toEqual(Array.from(expected.dR));
    expect(Array.from(out.dT)).toEqual(Array.from(expected.dT));
    // Layer 0 becomes n = 1.9 + 0.01i, written into the plan's permittivities (as Yield forecast
    // does for index errors).
    const L = stack.layers.length;
    for (let iw = 0; iw < 3; iw++) {
      plan.work.frontEpsRe[iw * L] = 1.9 * 1.9 - 0.01 * 0.01;
      plan.work.frontEpsIm[iw * L] = 2 * 1.9 * 0.01;
    }
    computeThicknessDerivatives(out, plan);
    const layers = movedStack.layers.map((l, i) =>
      i === 0 ? { ...l, material: constantIndex(1.9, 0.01) } : l,
    );
    const changedPlan = createSpectrumPlan({ ...movedStack, layers }, grid);
    const changed = computeThicknessDerivatives(createThicknessDerivatives(changedPlan), changedPlan);
    expect(Array.from(out.dR)).toEqual(Array.from(changed.dR));
    expect(Array.from(out.dT)).toEqual(Array.from(changed.dT));
    expect(Array.from(changed.dR)).not.toEqual(Array.from(expected.dR));
  });

  it('compute only the wanted spectrum points and leave the others as they were', () => {
    const stack = randomStack(4);
    const grid = { wavelengthsNm: [420, 555.5, 910], anglesDeg: [0, 37, 71], polarisations };
    const plan = createSpectrumPlan(stack, grid);
    const full = computeThicknessDerivatives(createThicknessDerivatives(plan), plan);
    // Every third point wanted; (420 nm, 37°) not at all, in any polarisation.
    const points = new Uint8Array(plan.size);
    for (let i = 0; i < plan.size; i++) points[i] = i % 3 === 0 ? 1 : 0;
    for (let ip = 0; ip < 3; ip++) points[(ip * 3 + 1) * 3] = 0;
    const part = createThicknessDerivatives(plan);
    part.dR.fill(7);
    part.dT.fill(7);
    computeThicknessDerivatives(part, plan, { points });
    const L = stack.layers.length;
    for (let l = 0; l < L; l++) {
      for (let i = 0; i < plan.size; i++) {
        const at = l * plan.size + i;
        const wanted = points[i] === 1;
        expect(part.dR[at]).toBe(wanted ? full.dR[at] : 7);
        expect(part.dT[at]).toBe(wanted ? full.dT[at] : 7);
      }
    }
    expect(() => computeThicknessDerivatives(part, plan, { points: new Uint8Array(2) })).toThrow(
      /points: must hold 27 flags/,
    );
    expect(() =>
      computeThicknessDerivatives(createThicknessDerivatives(plan, { wantT: false }), plan),
    ).toThrow(/out: derivative arrays/);
  });
});

describe('analytic needle function', () => {
  it.each([11, 12, 13, 14])('matches probing with a 0.01 nm layer on random absorbing stack %i', (seed) => {
    const stack = randomStack(seed);
    const rand = seededRandom(seed + 100);
    const grid = { wavelengthsNm: [450, 640], anglesDeg: [0, 45], polarisations };
    const plan = createSpectrumPlan(stack, grid);
    const gR = Float64Array.from({ length: plan.size }, () => rand() - 0.5);
    const gT = Float64Array.from({ length: plan.size }, () => rand() - 0.5);
    const needles = [constantIndex(2.3, 0.01), constantIndex(1.38)];
    const nW = grid.wavelengthsNm.length;
    const materials = {
      count: needles.length,
      epsRe: new Float64Array(needles.length * nW),
      epsIm: new Float64Array(needles.length * nW),
    };
    needles.forEach((m, i) => {
      const k = m.k ?? 0;
      for (let w = 0; w < nW; w++) {
        materials.epsRe[i * nW + w] = m.n * m.n - k * k;
        materials.epsIm[i * nW + w] = 2 * m.n * k;
      }
    });
    const depths = createNeedleGrid(
      stack.layers.map((l) => l.thicknessNm),
      25,
    );
    const analytic = needleFunction(
      new Float64Array(needles.length * depths.count),
      plan,
      materials,
      depths,
      gR,
      gT,
    );
    const merit = (s: OpticalStack) => {
      const res = calculateSpectrum(s, grid);
      let f = 0;
      for (let i = 0; i < plan.size; i++) {
        f +=
          elementAt(gR, i, 'gR') * elementAt(res.R, i, 'R') +
          elementAt(gT, i, 'gT') * elementAt(res.T, i, 'T');
      }
      return f;
    };
    const f0 = merit(stack);
    const probe = (point: number, m: number, thicknessNm: number) => {
      const j = elementAt(depths.layer, point, 'needle depth layers');
      const host = elementAt(stack.layers, j, 'layers');
      const offsetNm = elementAt(depths.offsetNm, point, 'needle depth offsets');
      const layers = [
        ...stack.layers.slice(0, j),
        { material: host.material, thicknessNm: offsetNm },
        { material: elementAt(needles, m, 'needles'), thicknessNm },
        { material: host.material, thicknessNm: host.thicknessNm - offsetNm },
        ...stack.layers.slice(j + 1),
      ];
      return (merit({ ...stack, layers }) - f0) / thicknessNm;
    };
    let scale = 0;
    const probed: number[] = [];
    for (let m = 0; m < needles.length; m++) {
      for (let k = 0; k < depths.count; k++) {
        const coarse = probe(k, m, 0.01);
        const fine = probe(k, m, 0.005);
        // Probing with 0.01 nm is first-order accurate; Richardson's 2·fine − coarse removes the
        // O(Δ) term so the check can be tight.
        probed.push(coarse, 2 * fine - coarse);
        scale = Math.max(scale, Math.abs(coarse));
      }
    }
    for (let i = 0; i < needles.length * depths.count; i++) {
      const a = elementAt(analytic, i, 'needle function');
      expect(Math.abs(a - elementAt(probed, 2 * i, 'probed'))).toBeLessThan(1e-3 * scale);
      expect(Math.abs(a - elementAt(probed, 2 * i + 1, 'probed'))).toBeLessThan(1e-6 * scale);
    }
    expect(scale).toBeGreaterThan(1e-4);
  });
});
