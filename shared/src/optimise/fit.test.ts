import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { responseAt } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import { evaluateMask, type SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import { fitToMask, layerBounds, refineThicknesses } from './fit.js';
import { createMaskMerit } from './merit.js';

const N0 = 1;
const NS = 1.52;
const REFERENCE_NM = 550;
/** R = 0 at 550 nm: a target band of one wavelength, 0 ± 0.01 %. */
const zeroAt550: SpecMask = {
  bands: [{ from_nm: 550, to_nm: 550, quantity: 'R', target_percent: 0, tolerance_percent: 0.01 }],
};

function onGlass(layers: { n: number; thicknessNm: number }[]): OpticalStack {
  return {
    incident: c(N0),
    layers: layers.map((l) => ({ material: c(l.n), thicknessNm: l.thicknessNm })),
    substrate: c(NS),
    backLayers: [],
    exit: c(N0),
  };
}

describe('Fit to mask', () => {
  // V-coat: two quarter waves, outer n1 and inner n2 with n2/n1 = √(ns/n0), give R = 0 at the
  // reference wavelength (Macleod, Thin-Film Optical Filters, 5th ed., ch. 4):
  // R = ((n0·n2² − ns·n1²)/(n0·n2² + ns·n1²))², and d = λ/(4n) for each layer (ch. 2).
  const n1 = 1.38;
  const n2 = n1 * Math.sqrt(NS / N0);
  const quarterWaves: readonly [number, number] = [REFERENCE_NM / (4 * n1), REFERENCE_NM / (4 * n2)];

  it('has the V-coat analytic zero the test relies on', () => {
    const analytic = ((N0 * n2 ** 2 - NS * n1 ** 2) / (N0 * n2 ** 2 + NS * n1 ** 2)) ** 2;
    expect(analytic).toBeLessThan(1e-30);
    const exact = onGlass([
      { n: n1, thicknessNm: quarterWaves[0] },
      { n: n2, thicknessNm: quarterWaves[1] },
    ]);
    expect(responseAt(exact, REFERENCE_NM, 0, 's').R).toBeLessThan(1e-20);
  });

  it.each([
    [1.15, 0.85],
    [0.85, 1.15],
    [1.15, 1.15],
    [0.85, 0.85],
  ])('refines a V-coat perturbed by %f / %f back to the quarter waves within 0.5 nm', (f1, f2) => {
    const start = onGlass([
      { n: n1, thicknessNm: quarterWaves[0] * f1 },
      { n: n2, thicknessNm: quarterWaves[1] * f2 },
    ]);
    const result = fitToMask(start, zeroAt550, { maxIterations: 200 });
    expect(result.merit.before).toBeGreaterThan(0.2);
    expect(Math.abs(elementAt(result.thicknessesNm, 0, 'fitted thicknesses') - quarterWaves[0])).toBeLessThan(
      0.5,
    );
    expect(Math.abs(elementAt(result.thicknessesNm, 1, 'fitted thicknesses') - quarterWaves[1])).toBeLessThan(
      0.5,
    );
    expect(result.merit.after).toBeLessThan(1e-6);
    expect(result.pass).toBe(true);
    expect(result.initialThicknessesNm).toEqual(start.layers.map((l) => l.thicknessNm));
  });

  it('finds the quarter wave as the best single layer at one wavelength, with its known R', () => {
    // Single quarter wave n1 = 1.38 on ns = 1.52: R = ((n0·ns − n1²)/(n0·ns + n1²))² = 1.2601 %,
    // the minimum of R over the thickness at that wavelength (Macleod, ch. 2).
    const result = fitToMask(onGlass([{ n: 1.38, thicknessNm: 80 }]), zeroAt550);
    expect(result.thicknessesNm[0]).toBeCloseTo(REFERENCE_NM / (4 * 1.38), 2);
    expect(result.merit.after).toBeCloseTo(100 * ((NS - 1.38 ** 2) / (NS + 1.38 ** 2)) ** 2, 6);
    expect(result.converged).toBe(true);
    expect(result.pass).toBe(false);
  });

  it('honours the bounds and the locks', () => {
    // The best single layer (99.64 nm) lies above the bound: the fit stops on it.
    const capped = fitToMask(onGlass([{ n: 1.38, thicknessNm: 80 }]), zeroAt550, { maxThicknessNm: 90 });
    expect(capped.thicknessesNm[0]).toBe(90);
    const floored = fitToMask(onGlass([{ n: 1.38, thicknessNm: 120 }]), zeroAt550, { minThicknessNm: [105] });
    expect(floored.thicknessesNm[0]).toBe(105);
    // A layer starting outside its bounds starts from the bound.
    const clipped = fitToMask(onGlass([{ n: 1.38, thicknessNm: 5 }]), zeroAt550, { maxIterations: 1 });
    expect(elementAt(clipped.history, 0, 'fit history').merit).toBeCloseTo(
      100 * responseAt(onGlass([{ n: 1.38, thicknessNm: 10 }]), 550, 0, 's').R,
      10,
    );
    const start = onGlass([
      { n: n1, thicknessNm: quarterWaves[0] * 1.1 },
      { n: n2, thicknessNm: quarterWaves[1] * 0.9 },
    ]);
    const locked = fitToMask(start, zeroAt550, { locked: [true, false] });
    expect(locked.thicknessesNm[0]).toBe(elementAt(start.layers, 0, 'layers').thicknessNm);
    expect(locked.thicknessesNm[1]).not.toBe(elementAt(start.layers, 1, 'layers').thicknessNm);
    expect(locked.merit.after).toBeLessThan(locked.merit.before);
  });

  it('refines a broadband AR onto the mask, which evaluateMask then confirms', () => {
    // R ≤ 0.5 % over 420–680 nm at 0° (visible broadband AR, common practice); n 1.38 / 2.35 on
    // n 1.52 (typical MgF2 / TiO2 values, common practice, from memory).
    const mask: SpecMask = {
      bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, step_nm: 2 }],
    };
    const start = onGlass(
      [90, 100, 30, 40, 20, 30, 15, 15].map((d, i) => ({ n: i % 2 === 0 ? 1.38 : 2.35, thicknessNm: d })),
    );
    expect(evaluateMask(mask, start).pass).toBe(false);
    const result = fitToMask(start, mask);
    const fitted = {
      ...start,
      layers: start.layers.map((l, i) => ({
        ...l,
        thicknessNm: elementAt(result.thicknessesNm, i, 'fitted thicknesses'),
      })),
    };
    const check = evaluateMask(mask, fitted);
    expect(check.pass).toBe(true);
    expect(check.worstMargin).toBeGreaterThan(0);
    expect(result.merit.after).toBe(0);
    for (const d of result.thicknessesNm) expect(d).toBeGreaterThanOrEqual(10);
  });

  it('designs in a target margin: every sample clears the limit by it, checked on the mask itself', () => {
    // The same broadband AR as above, now asked to clear R ≤ 0.5 % by 0.1 percentage points.
    const mask: SpecMask = {
      bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, step_nm: 2 }],
    };
    const start = onGlass(
      [90, 100, 30, 40, 20, 30, 15, 15].map((d, i) => ({ n: i % 2 === 0 ? 1.38 : 2.35, thicknessNm: d })),
    );
    const bare = fitToMask(start, mask);
    const result = fitToMask(start, mask, { marginPercent: 0.1 });
    expect(result.targetMarginPercent).toBe(0.1);
    expect(bare.targetMarginPercent).toBe(0.001);
    const fitted = {
      ...start,
      layers: start.layers.map((l, i) => ({
        ...l,
        thicknessNm: elementAt(result.thicknessesNm, i, 'fitted thicknesses'),
      })),
    };
    const check = evaluateMask(mask, fitted);
    expect(check.worstMargin).toBeGreaterThanOrEqual(0.1 - 1e-6);
    expect(result.worstMargin).toBeCloseTo(check.worstMargin, 10);
    expect(result.worstMargin).toBeGreaterThan(bare.worstMargin);
  });

  it('gives the same fit with the analytic Jacobian as with forward differences, oblique s and p', () => {
    // Both Jacobians describe the same residuals (the analytic one is checked against central
    // differences in optics/derivatives.test.ts), so Levenberg–Marquardt must reach the same minimum.
    const mask: SpecMask = {
      bands: [
        {
          from_nm: 420,
          to_nm: 680,
          quantity: 'R',
          max_percent: 0.2,
          step_nm: 5,
          angles_deg: [0, 30],
          polarisation: 'avg',
        },
      ],
    };
    const start = onGlass(
      [90, 100, 30, 40, 20, 30].map((d, i) => ({ n: i % 2 === 0 ? 1.38 : 2.35, thicknessNm: d })),
    );
    const analytic = fitToMask(start, mask, { maxIterations: 300 });
    const differences = fitToMask(start, mask, { maxIterations: 300, derivatives: 'differences' });
    expect(analytic.merit.after).toBeCloseTo(differences.merit.after, 5);
    analytic.thicknessesNm.forEach((d, i) =>
      expect(d).toBeCloseTo(elementAt(differences.thicknessesNm, i, 'fitted thicknesses'), 3),
    );
    // The analytic Jacobian costs one evaluation, differences one spectrum per free layer.
    expect(analytic.evaluations).toBeLessThan(differences.evaluations);
  });

  it.each([
    ['analytic', 0.05],
    ['analytic', 0.1],
    ['differences', 0.05],
    ['differences', 0.1],
  ] as const)(
    'leaves the merit at the refined thicknesses, so their residuals need no new spectrum (%s, R ≤ %f percent)',
    (derivatives, maxPercent) => {
      // Reference: the residuals of a spectrum computed afresh at the result on the same merit.
      // The two limits end one fit on an accepted step and the other on rejected trials.
      const mask: SpecMask = {
        bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: maxPercent, step_nm: 10 }],
      };
      const start = onGlass([95, 60, 25].map((d, i) => ({ n: i % 2 === 0 ? 1.38 : 2.1, thicknessNm: d })));
      const merit = createMaskMerit(start, mask);
      // The first layer starts below its lower bound, so the iterate is not the start.
      const fit = refineThicknesses(merit, [95, 60, 3], layerBounds(3, 5, 500, undefined), {
        maxIterations: 40,
        derivatives,
      });
      const kept = new Float64Array(merit.sampleCount);
      const fresh = new Float64Array(merit.sampleCount);
      const sum = merit.residualsOf(kept, true);
      expect(merit.residuals(fresh, fit.thicknessesNm)).toBe(sum);
      expect(Array.from(kept)).toEqual(Array.from(fresh));
      expect(fit.merit.after).toBe(merit.meritOf());
      expect(fit.iterations).toBeGreaterThan(0);
      expect(fit.merit.after).toBeLessThan(fit.merit.before);
    },
  );

  it('is deterministic, streams every iteration, and stops when told to', () => {
    const start = onGlass([
      { n: n1, thicknessNm: quarterWaves[0] * 1.15 },
      { n: n2, thicknessNm: quarterWaves[1] * 0.85 },
    ]);
    const seen: number[] = [];
    const first = fitToMask(start, zeroAt550, { onIteration: (info) => void seen.push(info.merit) });
    const second = fitToMask(start, zeroAt550);
    expect(second).toEqual(first);
    expect(seen).toEqual(first.history.slice(1).map((h) => h.merit));
    expect(first.history.map((h) => h.iteration)).toEqual(first.history.map((_, i) => i));
    // a target band only: the merit falls at every accepted step
    for (let i = 1; i < first.history.length; i++) {
      expect(elementAt(first.history, i, 'fit history').merit).toBeLessThan(
        elementAt(first.history, i - 1, 'fit history').merit,
      );
    }
    const stopped = fitToMask(start, zeroAt550, { onIteration: (info) => info.iteration < 2 });
    expect(stopped.stoppedBy).toBe('cancelled');
    expect(stopped.iterations).toBe(2);
    expect(stopped.converged).toBe(false);
    expect(stopped.thicknessesNm).not.toEqual(first.thicknessesNm);
  });

  it('rejects bad input with errors naming the field', () => {
    const one = onGlass([{ n: 1.38, thicknessNm: 100 }]);
    const two = onGlass([
      { n: 1.38, thicknessNm: 100 },
      { n: 2.35, thicknessNm: 50 },
    ]);
    const cases: [() => unknown, RegExp][] = [
      [() => fitToMask(onGlass([]), zeroAt550), /^layers: the stack has no layers to fit/],
      [() => fitToMask(one, zeroAt550, { derivatives: 'numeric' as never }), /^derivatives: /],
      [() => fitToMask(two, zeroAt550, { locked: [true, true] }), /^locked: every layer is locked/],
      [() => fitToMask(two, zeroAt550, { locked: [true] }), /^locked: must be a list of 2/],
      [
        () => fitToMask(one, zeroAt550, { minThicknessNm: 200, maxThicknessNm: 100 }),
        /^minThicknessNm: must not exceed maxThicknessNm/,
      ],
      [
        () => fitToMask(two, zeroAt550, { minThicknessNm: [10, 80], maxThicknessNm: 60 }),
        /^minThicknessNm\[1\]: must not exceed .* for layer 1/,
      ],
      [
        () => fitToMask(two, zeroAt550, { maxThicknessNm: [100] }),
        /^maxThicknessNm: needs one value per layer/,
      ],
      [() => fitToMask(one, zeroAt550, { minThicknessNm: -1 }), /^minThicknessNm: must be 0 or more/],
      [
        () => fitToMask(one, zeroAt550, { minThicknessNm: Number.NaN }),
        /^minThicknessNm: must be a finite number/,
      ],
      [() => fitToMask(one, { bands: [] }), /^bands: must hold at least one limit band/],
      [() => fitToMask(one, zeroAt550, { maxIteration: 5 } as never), /^maxIteration: is not a known field/],
      [
        () => fitToMask(one, zeroAt550, { maxIterations: 0 }),
        /^maxIterations: must be a whole number from 1/,
      ],
    ];
    for (const [run, message] of cases) {
      expect(run).toThrow(OpticsInputError);
      expect(run).toThrow(message);
    }
  });
});
