import { describe, expect, it } from 'vitest';
import {
  calculateSpectrum,
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  createSpectrumPlanFor,
  responseAt,
  setLayerThicknesses,
  spectrumIndex,
} from './batch.js';
import { elementAt } from '../checked.js';
import { constantIndex as c } from './dispersion.js';
import type { OpticalStack } from './stack.js';

const twoLayer: OpticalStack = {
  incident: c(1),
  layers: [
    { material: c(2.35, 0.0001), thicknessNm: 50 },
    { material: c(1.46), thicknessNm: 93.2 },
  ],
  substrate: c(1.52),
  backLayers: [],
  exit: c(1),
};

describe('grid layout', () => {
  it('stores (pol, angle, wavelength) at (iPol·nAngles + iAngle)·nWl + iWl, matching single points', () => {
    const grid = {
      wavelengthsNm: [450, 550, 650],
      anglesDeg: [0, 30, 60],
      polarisations: ['s', 'p', 'avg'] as const,
    };
    const res = calculateSpectrum(twoLayer, { ...grid, polarisations: [...grid.polarisations] });
    grid.polarisations.forEach((pol, ip) =>
      grid.anglesDeg.forEach((angle, ia) =>
        grid.wavelengthsNm.forEach((wl, iw) => {
          const i = spectrumIndex(res.plan, ip, ia, iw);
          expect(i).toBe((ip * 3 + ia) * 3 + iw);
          const point = responseAt(twoLayer, wl, angle, pol);
          expect(res.R[i]).toBe(point.R);
          expect(res.T[i]).toBe(point.T);
          expect(res.A[i]).toBe(point.A);
        }),
      ),
    );
    // avg is the mean of s and p (unpolarised light).
    const s = spectrumIndex(res.plan, 0, 2, 1);
    const p = spectrumIndex(res.plan, 1, 2, 1);
    const avg = spectrumIndex(res.plan, 2, 2, 1);
    const rS = elementAt(res.R, s, 'R');
    const rP = elementAt(res.R, p, 'R');
    expect(res.R[avg]).toBeCloseTo((rS + rP) / 2, 16);
    expect(rS).not.toBeCloseTo(rP, 3);
  });

  it('reuses a plan without allocating and follows thickness updates', () => {
    const plan = createSpectrumPlan(twoLayer, {
      wavelengthsNm: [500, 600],
      anglesDeg: [0],
      polarisations: ['s'],
    });
    const out = createSpectrumOutput(plan);
    computeSpectrum(out, plan);
    const before = Array.from(out.R);
    setLayerThicknesses(plan, [60, 80]);
    computeSpectrum(out, plan);
    const moved = calculateSpectrum(
      {
        ...twoLayer,
        layers: [
          { ...elementAt(twoLayer.layers, 0, 'layers'), thicknessNm: 60 },
          { ...elementAt(twoLayer.layers, 1, 'layers'), thicknessNm: 80 },
        ],
      },
      { wavelengthsNm: [500, 600], anglesDeg: [0], polarisations: ['s'] },
    );
    expect(Array.from(out.R)).toEqual(Array.from(moved.R));
    expect(out.R[0]).not.toBe(before[0]);
    expect(() => setLayerThicknesses(plan, [60])).toThrow(/thicknessesNm: needs 2 values/);
    expect(() => setLayerThicknesses(plan, [60, -1])).toThrow(/thicknessesNm\[1\]/);
  });

  it('writes the complex amplitudes when asked for', () => {
    const res = calculateSpectrum(
      twoLayer,
      { wavelengthsNm: [550], anglesDeg: [0], polarisations: ['s'] },
      { amplitudes: true },
    );
    const r = res.r as Float64Array;
    expect(elementAt(r, 0, 'r') ** 2 + elementAt(r, 1, 'r') ** 2).toBeCloseTo(elementAt(res.R, 0, 'R'), 15);
  });
});

describe('entry-point validation', () => {
  const grid = { wavelengthsNm: [550], anglesDeg: [0], polarisations: ['s' as const] };
  it.each([
    [{ ...grid, wavelengthsNm: [550, Number.NaN] }, {}, /wavelengthsNm\[1\]: must be a finite number/],
    [{ ...grid, wavelengthsNm: [-5] }, {}, /wavelengthsNm\[0\]: must be greater than 0/],
    [{ ...grid, wavelengthsNm: [] }, {}, /wavelengthsNm: must not be empty/],
    [
      { ...grid, anglesDeg: [90] },
      {},
      /anglesDeg\[0\]: angle of incidence must be at least 0° and below 90°/,
    ],
    [{ ...grid, polarisations: [] }, {}, /polarisations: must list at least one/],
    [{ ...grid, polarisations: ['s', 's'] }, {}, /polarisations\[1\]: "s" is listed twice/],
    [{ ...grid, polarisations: ['x'] }, {}, /polarisations\[0\]: must be one of/],
    [grid, { back: 'both' }, /back: must be one of "none", "incoherent"/],
    [grid, { back: 'incoherent', amplitudes: true }, /amplitudes: complex r and t exist only/],
    [{ ...grid, polarisations: ['avg'] }, { amplitudes: true }, /amplitudes: .* not for their average/],
  ])('%#', (g, options, message) => {
    expect(() => createSpectrumPlan(twoLayer, g as never, options as never)).toThrow(message);
  });

  it('rejects an absorbing incident medium and a negative thickness', () => {
    expect(() => createSpectrumPlan({ ...twoLayer, incident: c(1.5, 0.01) }, grid)).toThrow(
      /incident: the incident medium must be lossless/,
    );
    expect(() =>
      createSpectrumPlan({ ...twoLayer, layers: [{ material: c(2), thicknessNm: -3 }] }, grid),
    ).toThrow(/layers\[0\]\.thicknessNm: must be 0 or more/);
  });

  it('flags clamped table values as a warning', () => {
    const table = { model: 'table' as const, wavelengths: [400, 700], n: [2.3, 2.2], clamp: true };
    const plan = createSpectrumPlan(
      { ...twoLayer, layers: [{ material: table, thicknessNm: 60 }] },
      {
        ...grid,
        wavelengthsNm: [380, 550, 720],
      },
    );
    expect(plan.warnings).toEqual([
      'layers[0]: table covers 400–700 nm; its end values were held at 2 of 3 wavelengths',
    ]);
  });

  it('flags held formula values as a warning and refuses them without clamp', () => {
    const sellmeier = {
      model: 'sellmeier' as const,
      B: [1.03961212, 0.231792344, 1.01046945],
      C: [0.00600069867, 0.0200179144, 103.560653],
      validNm: { from: 400, to: 700 },
    };
    const wavelengthsNm = [380, 550, 720];
    const plan = createSpectrumPlan(
      { ...twoLayer, substrate: { ...sellmeier, clamp: true } },
      { ...grid, wavelengthsNm },
    );
    expect(plan.warnings).toEqual([
      'substrate: sellmeier model holds for 400–700 nm; its end values were held at 2 of 3 wavelengths',
    ]);
    expect(() =>
      createSpectrumPlan({ ...twoLayer, substrate: sellmeier }, { ...grid, wavelengthsNm }),
    ).toThrow(/substrate\.validNm: 380 nm is outside/);
  });
});

describe('a plan for another stack on the same grid', () => {
  // Reference for every check here: a fresh createSpectrumPlan of the same stack, the path the
  // tests above hold against single points and the handbook formulas.
  const high = {
    model: 'table' as const,
    wavelengths: [400, 500, 600, 700, 800],
    n: [2.45, 2.38, 2.33, 2.3, 2.28],
    k: [0.002, 0.001, 0, 0, 0],
    interpolation: 'pchip' as const,
    clamp: true,
  };
  const low = { model: 'table' as const, wavelengths: [380, 900], n: [1.47, 1.45] };
  const glass = {
    model: 'sellmeier' as const,
    B: [1.03961212, 0.231792344, 1.01046945],
    C: [0.00600069867, 0.0200179144, 103.560653],
  };
  const stackOf = (materials: readonly (typeof high | typeof low)[]): OpticalStack => ({
    incident: c(1),
    layers: materials.map((material, i) => ({ material, thicknessNm: 40 + 17 * i })),
    substrate: glass,
    substrateThicknessMm: 1,
    backLayers: [{ material: low, thicknessNm: 95 }],
    exit: c(1),
  });
  const grid = {
    wavelengthsNm: [390, 450, 560, 640, 850],
    anglesDeg: [0, 35],
    polarisations: ['s', 'p', 'avg'] as const,
  };
  const fresh = (stack: OpticalStack, back: 'none' | 'incoherent') =>
    createSpectrumPlan(stack, { ...grid, polarisations: [...grid.polarisations] }, { back });
  const spectrumOf = (plan: ReturnType<typeof createSpectrumPlan>) =>
    computeSpectrum(createSpectrumOutput(plan), plan);

  it.each(['none', 'incoherent'] as const)(
    'gives bit-identical R, T, A and the same warnings as a fresh plan (back %s)',
    (back) => {
      const first = fresh(stackOf([low, high]), back);
      const other = stackOf([high, low, high, low, high]);
      const reused = createSpectrumPlanFor(other, first);
      const expected = spectrumOf(fresh(other, back));
      const got = spectrumOf(reused);
      expect(Array.from(got.R)).toEqual(Array.from(expected.R));
      expect(Array.from(got.T)).toEqual(Array.from(expected.T));
      expect(Array.from(got.A)).toEqual(Array.from(expected.A));
      expect(reused.back).toBe(back);
      // The high-index table ends at 800 nm: 850 nm is held, and named by the layers it fills now.
      expect(reused.warnings).toEqual(fresh(other, back).warnings);
      expect(reused.warnings).toEqual(
        [0, 2, 4].map(
          (l) => `layers[${l}]: table covers 400–800 nm; its end values were held at 2 of 5 wavelengths`,
        ),
      );
      // The materials were taken over from the first plan, not checked again.
      expect(reused.stack.layers[1]?.material).toBe(first.stack.layers[0]?.material);
    },
  );

  it('checks and evaluates a material again after its data changed in place', () => {
    const edited = { ...high, n: [...high.n] };
    const first = fresh(stackOf([edited, low]), 'none');
    const before = spectrumOf(first).R[0];
    edited.n[0] = 2.1;
    const reused = createSpectrumPlanFor(stackOf([edited, low]), first);
    const expected = spectrumOf(fresh(stackOf([edited, low]), 'none'));
    expect(Array.from(spectrumOf(reused).R)).toEqual(Array.from(expected.R));
    expect(expected.R[0]).not.toBe(before);
    expect(reused.stack.layers[0]?.material).not.toBe(first.stack.layers[0]?.material);
    // Invalid data is refused as by a fresh plan, even for an object seen before.
    edited.n[1] = -1;
    expect(() => createSpectrumPlanFor(stackOf([edited, low]), first)).toThrow(
      /layers\[0\]\.material\.n\[1\]: must be greater than 0 \(got -1\)/,
    );
  });

  it('refuses wavelengths outside a table without clamp as a fresh plan does', () => {
    const narrow = { model: 'table' as const, wavelengths: [400, 700], n: [1.47, 1.45] };
    const first = fresh(stackOf([high]), 'none');
    const other = stackOf([high, narrow]);
    expect(() => fresh(other, 'none')).toThrow(/layers\[1\]/);
    expect(() => createSpectrumPlanFor(other, first)).toThrow(/layers\[1\]/);
  });
});
