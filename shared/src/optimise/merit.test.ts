import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { calculateSpectrum } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import { evaluateMask, evaluateMaskOnSpectrum, type SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import { createMaskMerit, rms, type MaskMerit } from './merit.js';

/**
 * Largest difference between `jac` (every layer free) and central differences (h = 1e-4 nm) of
 * the residuals, and the largest difference quotient, over the samples `use` accepts.
 */
function againstDifferences(
  merit: MaskMerit,
  jac: Float64Array,
  d: readonly number[],
  use: (sample: number) => boolean,
): { worst: number; scale: number } {
  const m = merit.sampleCount;
  const plus = new Float64Array(m);
  const minus = new Float64Array(m);
  const h = 1e-4;
  let worst = 0;
  let scale = 0;
  for (let j = 0; j < d.length; j++) {
    const up = d.slice();
    const down = d.slice();
    up[j] = elementAt(d, j, 'the thicknesses') + h;
    down[j] = elementAt(d, j, 'the thicknesses') - h;
    merit.residuals(plus, up);
    merit.residuals(minus, down);
    for (let s = 0; s < m; s++) {
      if (!use(s)) continue;
      const fd = (elementAt(plus, s, 'the residuals') - elementAt(minus, s, 'the residuals')) / (2 * h);
      worst = Math.max(worst, Math.abs(fd - elementAt(jac, s * d.length + j, 'the Jacobian')));
      scale = Math.max(scale, Math.abs(fd));
    }
  }
  return { worst, scale };
}

const stack: OpticalStack = {
  incident: c(1),
  layers: [
    { material: c(1.38), thicknessNm: 96 },
    { material: c(2.1, 0.002), thicknessNm: 41 },
    { material: c(1.46), thicknessNm: 23 },
  ],
  substrate: c(1.52),
  backLayers: [],
  exit: c(1),
};

// Bands of every kind, weights, two angles and three polarisations, so every branch of the merit
// counts; the mask's own evaluation (mask.ts) is the reference for the identity RMS(r) = merit.
const mixedMask: SpecMask = {
  bands: [
    { from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.8, angles_deg: [0, 30], step_nm: 5 },
    {
      from_nm: 450,
      to_nm: 650,
      quantity: 'T',
      min_percent: 99.5,
      polarisation: 's',
      angles_deg: [30],
      weight: 3,
    },
    {
      from_nm: 500,
      to_nm: 520,
      quantity: 'R',
      target_percent: 0.4,
      tolerance_percent: 0.3,
      polarisation: 'p',
      step_nm: 2,
    },
  ],
};

describe('mask merit', () => {
  it('has residuals whose RMS is the mask merit of evaluateMaskOnSpectrum, on the same spectrum', () => {
    const merit = createMaskMerit(stack, mixedMask);
    const residuals = new Float64Array(merit.sampleCount);
    const sum = merit.residualsOf(residuals, false, merit.compute(stack.layers.map((l) => l.thicknessNm)));
    const reference = evaluateMaskOnSpectrum(mixedMask, merit.plan, merit.spectrum);
    expect(reference.merit).toBeGreaterThan(0.05);
    expect(rms(residuals)).toBeCloseTo(reference.merit, 12);
    expect(Math.sqrt(sum / merit.sampleCount)).toBeCloseTo(reference.merit, 12);
    expect(merit.meritOf()).toBeCloseTo(reference.merit, 12);
    expect(merit.worstMarginOf()).toBeCloseTo(reference.worstMargin, 12);
    // and equal to a fresh evaluation of the stack, which plans its own grid
    expect(merit.meritOf()).toBeCloseTo(evaluateMask(mixedMask, stack).merit, 12);
  });

  it('serves every polarisation from one s pass at normal incidence, with the same merit', () => {
    const mask: SpecMask = {
      bands: [
        { from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 0.5 },
        {
          from_nm: 540,
          to_nm: 560,
          quantity: 'T',
          target_percent: 99.7,
          tolerance_percent: 0.1,
          polarisation: 'p',
        },
      ],
    };
    const merit = createMaskMerit(stack, mask);
    expect(merit.plan.polarisations).toEqual(['s']);
    merit.compute(stack.layers.map((l) => l.thicknessNm));
    // s and p coincide at normal incidence (Hecht, Optics, ch. 4): same merit as the avg/p grid
    const reference = evaluateMask(mask, stack);
    expect(merit.meritOf()).toBeCloseTo(reference.merit, 12);
    expect(merit.worstMarginOf()).toBeCloseTo(reference.worstMargin, 12);
  });

  it('counts bare-glass violations as R − max, with the margin tightening the limit', () => {
    // Bare n = 1.52 in air: R = ((1 − 1.52)/(1 + 1.52))² = 4.2580 % (Hecht, Optics, ch. 4).
    const glass: OpticalStack = { ...stack, layers: [] };
    const rGlass = 100 * (0.52 / 2.52) ** 2;
    const mask: SpecMask = {
      bands: [{ from_nm: 500, to_nm: 600, quantity: 'R', max_percent: 4, step_nm: 10 }],
    };
    const merit = createMaskMerit(glass, mask, { marginPercent: 0.25 });
    const r = new Float64Array(merit.sampleCount);
    merit.compute([]);
    merit.residualsOf(r, true);
    expect(merit.sampleCount).toBe(11);
    for (const v of r) expect(v).toBeCloseTo(rGlass - 3.75, 12);
    merit.residualsOf(r, false);
    for (const v of r) expect(v).toBeCloseTo(rGlass - 4, 12);
    expect(merit.meritOf()).toBeCloseTo(rGlass - 4, 12);
    expect(merit.worstMarginOf()).toBeCloseTo(4 - rGlass, 12);
  });

  it('pulls every limit sample towards 0 % (max) or 100 % (min) when smooth, merit and margins unchanged', () => {
    // Bare n = 1.52 in air: R = 4.2580 %, T = 95.7420 % (Hecht, Optics, ch. 4); both bands are met,
    // so the one-sided merit has no residual, the smooth one R − 0 and T − 100 at every sample.
    const glass: OpticalStack = { ...stack, layers: [] };
    const rGlass = 100 * (0.52 / 2.52) ** 2;
    const mask: SpecMask = {
      bands: [
        { from_nm: 500, to_nm: 600, quantity: 'R', max_percent: 5, step_nm: 50 },
        { from_nm: 500, to_nm: 600, quantity: 'T', min_percent: 95, step_nm: 50 },
      ],
    };
    const oneSided = createMaskMerit(glass, mask, { marginPercent: 0.25 });
    const smooth = createMaskMerit(glass, mask, { marginPercent: 0.25, smooth: true });
    const r = new Float64Array(smooth.sampleCount);
    oneSided.compute([]);
    expect(oneSided.residualsOf(r, true)).toBe(0);
    smooth.compute([]);
    const sum = smooth.residualsOf(r, true);
    expect(Array.from(r.slice(0, 3))).toEqual([rGlass, rGlass, rGlass].map((v) => expect.closeTo(v, 12)));
    expect(Array.from(r.slice(3))).toEqual([1, 1, 1].map(() => expect.closeTo(-rGlass, 12)));
    expect(sum).toBeCloseTo(6 * rGlass * rGlass, 9);
    // the mask's own merit and margin do not change
    expect(smooth.meritOf()).toBe(0);
    expect(smooth.worstMarginOf()).toBeCloseTo(oneSided.worstMarginOf(), 12);
    expect(() => createMaskMerit(glass, mask, { smooth: 1 as never })).toThrow(
      /^smooth: must be true or false/,
    );
  });

  it('gives the smooth merit an analytic Jacobian that matches central differences', () => {
    const smooth = createMaskMerit(stack, mixedMask, { smooth: true });
    const d = stack.layers.map((l) => l.thicknessNm);
    const m = smooth.sampleCount;
    const jac = new Float64Array(m * d.length);
    smooth.compute(d);
    smooth.jacobian(jac, d, [0, 1, 2]);
    const { worst, scale } = againstDifferences(smooth, jac, d, () => true);
    // Every sample is active on the smooth merit, so no column is zero.
    expect(scale).toBeGreaterThan(1e-3);
    expect(worst).toBeLessThan(1e-6 * scale);
  });

  it('gives the one-sided merit an R-only Jacobian with zero rows where a limit is met', () => {
    // Central differences of the residuals are the reference (the one-sided derivative on the
    // violated side; zero where a limit is met and stays met within the step).
    const mask: SpecMask = {
      bands: [{ from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 5, angles_deg: [0, 30] }],
    };
    const merit = createMaskMerit(stack, mask);
    const d = stack.layers.map((l) => l.thicknessNm);
    const m = merit.sampleCount;
    const r = new Float64Array(m);
    merit.residuals(r, d);
    const active = Array.from(r, (v) => (v !== 0 ? 1 : 0));
    expect(active.filter((a) => a === 1).length).toBeGreaterThan(5);
    expect(active.filter((a) => a === 0).length).toBeGreaterThan(5);
    const jac = new Float64Array(m * d.length).fill(9);
    merit.jacobian(jac, d, [0, 1, 2]);
    const { worst, scale } = againstDifferences(merit, jac, d, (s) => {
      if (active[s] === 1) return true;
      // A met limit's row is zero (the buffer held 9 before).
      for (let j = 0; j < d.length; j++) expect(elementAt(jac, s * d.length + j, 'the Jacobian')).toBe(0);
      return false;
    });
    expect(scale).toBeGreaterThan(1e-3);
    expect(worst).toBeLessThan(1e-6 * scale);
  });

  it('gives a merit for another stack the residuals of a fresh merit, bit for bit', () => {
    // Reference: createMaskMerit of the other stack, which the RMS identity tests above hold.
    const first = createMaskMerit(stack, mixedMask, { marginPercent: 0.1 });
    const otherStack: OpticalStack = {
      ...stack,
      layers: [...stack.layers, { material: stack.layers[1]?.material ?? c(2), thicknessNm: 12 }],
    };
    const other = first.withStack(otherStack);
    const fresh = createMaskMerit(otherStack, mixedMask, { marginPercent: 0.1 });
    const d = otherStack.layers.map((l) => l.thicknessNm);
    const got = new Float64Array(other.sampleCount);
    const expected = new Float64Array(fresh.sampleCount);
    const sum = other.residuals(got, d);
    expect(sum).toBe(fresh.residuals(expected, d));
    expect(sum).toBeGreaterThan(0);
    expect(Array.from(got)).toEqual(Array.from(expected));
    expect(other.layerCount).toBe(4);
  });

  it('adds target curves to the weighted RMS, on wavelengths the mask does not have', () => {
    const glass: OpticalStack = { ...stack, layers: [] };
    const rGlass = 100 * (0.52 / 2.52) ** 2;
    const mask: SpecMask = { bands: [{ from_nm: 500, to_nm: 500, quantity: 'R', max_percent: 5 }] };
    const merit = createMaskMerit(glass, mask, {
      targets: [{ quantity: 'R', wavelengthsNm: [512.5, 633], valuesPercent: [4, 3], weight: 2 }],
    });
    merit.compute([]);
    // one mask sample (met, deviation 0, weight 1) and two target samples of weight 2
    const expected = Math.sqrt((2 * (rGlass - 4) ** 2 + 2 * (rGlass - 3) ** 2) / 5);
    expect(merit.meritOf()).toBeCloseTo(expected, 12);
    // targets have no margin: the mask's worst margin alone
    expect(merit.worstMarginOf()).toBeCloseTo(5 - rGlass, 12);
  });

  it('allocates one spectrum and reuses it: a later evaluation overwrites the earlier one', () => {
    const merit = createMaskMerit(stack, mixedMask);
    const first = merit.compute([96, 41, 23]);
    const before = Array.from(first.R);
    const second = merit.compute([90, 45, 20]);
    expect(second).toBe(first);
    expect(Array.from(second.R)).not.toEqual(before);
    expect(Array.from(second.R)).toEqual(
      Array.from(
        calculateSpectrum(
          {
            ...stack,
            layers: stack.layers.map((l, i) => ({
              ...l,
              thicknessNm: elementAt([90, 45, 20], i, 'thicknesses'),
            })),
          },
          merit.plan,
        ).R,
      ),
    );
  });

  it('rejects bad masks and targets, naming the field', () => {
    expect(() => createMaskMerit(stack, { bands: [] })).toThrow(OpticsInputError);
    expect(() => createMaskMerit(stack, { bands: [] })).toThrow(/^bands: must hold at least one/);
    const target = { quantity: 'R' as const, wavelengthsNm: [500, 510], valuesPercent: [1] };
    expect(() => createMaskMerit(stack, mixedMask, { targets: [target] })).toThrow(
      /^targets\[0\]\.valuesPercent:/,
    );
    expect(() =>
      createMaskMerit(stack, mixedMask, { targets: [{ ...target, valuesPercent: [1, 140] }] }),
    ).toThrow(/^targets\[0\]\.valuesPercent\[1\]: must lie between 0 and 100/);
    expect(() => createMaskMerit(stack, mixedMask, { marginPercent: -1 })).toThrow(/^marginPercent:/);
  });
});
