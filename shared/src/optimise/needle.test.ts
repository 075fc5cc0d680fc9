import { describe, expect, it } from 'vitest';
import { elementAt, required } from '../checked.js';
import { calculateSpectrum } from '../optics/batch.js';
import { createNeedleGrid, needleFunction } from '../optics/derivatives.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import { MATERIAL_LIBRARY } from '../optics/library.js';
import { evaluateMask, type SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import { createMaskMerit } from './merit.js';
import { dropThinLayers, growLayers, type AllowedMaterial } from './needle.js';

// Typical coating indices near 550 nm (common practice, from memory): MgF2 1.38, SiO2 1.46,
// TiO2 2.35, taken as constant.
const MGF2 = c(1.38);
const allowed: AllowedMaterial[] = [
  { name: 'MgF2', model: MGF2 },
  { name: 'SiO2', model: c(1.46) },
  { name: 'TiO2', model: c(2.35) },
];
/** Visible broadband AR: R ≤ 0.5 % over 420–680 nm at 0° (a common customer requirement; common practice). */
const broadbandAr: SpecMask = { bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5 }] };
/** A single MgF2 quarter wave at 550 nm on N-BK7 (SCHOTT Sellmeier data from MATERIAL_LIBRARY). */
const quarterWaveOnBk7: OpticalStack = {
  incident: c(1),
  layers: [{ material: MGF2, thicknessNm: 550 / (4 * 1.38) }],
  substrate: required(MATERIAL_LIBRARY['N-BK7'], 'library material N-BK7'),
  backLayers: [],
  exit: c(1),
};

describe('Grow layers', () => {
  it('grows a single MgF2 quarter wave on N-BK7 into a broadband AR meeting R ≤ 0.5 % with ≤ 10 layers', () => {
    // The single quarter wave leaves R ≈ 1.2–1.8 % in the band (Macleod, ch. 4), so growth is needed.
    expect(evaluateMask(broadbandAr, quarterWaveOnBk7).pass).toBe(false);
    const result = growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 10 });
    expect(result.stoppedBy).toBe('maskMet');
    expect(result.final.layerCount).toBeLessThanOrEqual(10);
    expect(result.final.layerCount).toBeGreaterThan(1);
    // Checked independently of the optimiser's merit, on the mask's own evaluation.
    const check = evaluateMask(broadbandAr, result.stack);
    expect(check.pass).toBe(true);
    expect(check.worstMargin).toBeCloseTo(result.final.worstMargin, 10);
    for (const layer of result.stack.layers) expect(layer.thicknessNm).toBeGreaterThanOrEqual(10);
    // Progression: step 0 is the refined start, merit falls step by step, each step's stack kept.
    const start = elementAt(result.steps, 0, 'steps');
    expect(start.layerCount).toBe(1);
    expect(elementAt(start.layers, 0, 'step layers').material).toBe('MgF2');
    for (let i = 1; i < result.steps.length; i++) {
      const step = elementAt(result.steps, i, 'steps');
      expect(step.merit).toBeLessThan(elementAt(result.steps, i - 1, 'steps').merit);
      expect(step.inserted).toBeDefined();
    }
    expect(result.final).toBe(result.steps[result.steps.length - 1]);
    expect(result.final.layers.map((l) => l.thicknessNm)).toEqual(
      result.stack.layers.map((l) => l.thicknessNm),
    );
    const models = new Map(allowed.map((m) => [m.name, m.model]));
    result.final.layers.forEach((l, i) =>
      expect(elementAt(result.stack.layers, i, 'layers').material).toEqual(models.get(l.material)),
    );
    // the stack file of every step can be rebuilt from its plain layers
    const step1 = elementAt(result.steps, 1, 'steps');
    const rebuilt = {
      ...quarterWaveOnBk7,
      layers: step1.layers.map((l) => ({
        material: models.get(l.material) ?? MGF2,
        thicknessNm: l.thicknessNm,
      })),
    };
    expect(evaluateMask(broadbandAr, rebuilt).merit).toBeCloseTo(step1.merit, 10);
  });

  it('keeps growing until the mask is met with the target margin, not at the first pass', () => {
    const bare = growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 14 });
    const margin = Math.max(0.05, bare.final.worstMargin + 0.05);
    const result = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      maxLayers: 14,
      marginPercent: margin,
    });
    expect(result.targetMarginPercent).toBe(margin);
    expect(result.stoppedBy).toBe('maskMet');
    // Checked on the mask's own evaluation, not the optimiser's merit.
    expect(evaluateMask(broadbandAr, result.stack).worstMargin).toBeGreaterThanOrEqual(margin - 1e-6);
    expect(result.final.worstMargin).toBeGreaterThan(bare.final.worstMargin);
  });

  it('keeps an outermost-only material on top and the substrate neighbour from its list', () => {
    const free = growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 12 });
    const ruled = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      maxLayers: 12,
      outermostOnly: ['MgF2'],
      nextToSubstrate: ['SiO2', 'TiO2'],
    });
    const inner = (r: typeof free) => r.final.layers.slice(1).map((l) => l.material);
    // Without the rule the needle method puts MgF2 inside the stack too.
    expect(inner(free)).toContain('MgF2');
    expect(inner(ruled)).not.toContain('MgF2');
    expect(elementAt(ruled.final.layers, 0, 'layers').material).toBe('MgF2');
    expect(['SiO2', 'TiO2', 'MgF2']).toContain(ruled.final.layers.at(-1)?.material);
    expect(evaluateMask(broadbandAr, ruled.stack).worstMargin).toBeCloseTo(ruled.final.worstMargin, 10);
    expect(() =>
      growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, outermostOnly: ['ZnS'] }),
    ).toThrow('outermostOnly[0]: "ZnS" is not an allowed material');
  });

  it('grows the same design from the analytic needle function as from probing with thin needles', () => {
    const analytic = growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 10 });
    const probed = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      maxLayers: 10,
      derivatives: 'differences',
    });
    expect(analytic.final.layers.map((l) => l.material)).toEqual(probed.final.layers.map((l) => l.material));
    analytic.final.layers.forEach((l, i) =>
      expect(l.thicknessNm).toBeCloseTo(elementAt(probed.final.layers, i, 'probed layers').thicknessNm, 2),
    );
  });

  it("keeps the start's front layer outermost when asked", () => {
    const result = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed.filter((m) => m.name !== 'MgF2'),
      layerMaterials: ['MgF2'],
      outermostFixed: true,
      maxLayers: 10,
    });
    for (const step of result.steps) expect(elementAt(step.layers, 0, 'step layers').material).toBe('MgF2');
    expect(result.steps.length).toBeGreaterThan(1);
    expect(() =>
      growLayers(quarterWaveOnBk7, broadbandAr, {
        allowedMaterials: allowed,
        outermostFixed: 'yes' as never,
      }),
    ).toThrow(/outermostFixed/);
  });

  it('is deterministic and reports each step; returning false stops it', () => {
    const seen: number[] = [];
    const first = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      onStep: (step) => void seen.push(step.layerCount),
    });
    expect(growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed })).toEqual(first);
    expect(seen).toEqual(first.steps.map((s) => s.layerCount));
    const stopped = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      onStep: () => false,
    });
    expect(stopped.stoppedBy).toBe('cancelled');
    expect(stopped.steps).toHaveLength(1);
  });

  it('also grows from a bare substrate', () => {
    const bare = { ...quarterWaveOnBk7, layers: [] };
    const result = growLayers(bare, broadbandAr, { allowedMaterials: allowed, maxLayers: 10 });
    expect(elementAt(result.steps, 0, 'steps').layerCount).toBe(0);
    expect(result.stoppedBy).toBe('maskMet');
    expect(evaluateMask(broadbandAr, result.stack).pass).toBe(true);
  });

  it('stops at the layer limit without meeting the mask when too few layers are allowed', () => {
    const result = growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 2 });
    expect(result.stoppedBy).toBe('maxLayers');
    expect(result.final.layerCount).toBeLessThanOrEqual(2);
    expect(result.final.pass).toBe(false);
    expect(evaluateMask(broadbandAr, result.stack).pass).toBe(false);
  });

  it('removes layers thinner than the minimum and merges the neighbours of one material', () => {
    const layers = [
      { material: 'A', thicknessNm: 50 },
      { material: 'B', thicknessNm: 5 },
      { material: 'A', thicknessNm: 40 },
      { material: 'C', thicknessNm: 30 },
      { material: 'A', thicknessNm: 8 },
    ];
    expect(dropThinLayers(layers, 10)).toEqual([
      { material: 'A', thicknessNm: 90 },
      { material: 'C', thicknessNm: 30 },
    ]);
    expect(elementAt(layers, 0, 'layers').thicknessNm).toBe(50);
  });

  it('grows on the smooth merit and fits each step to the one-sided mask merit within the bounds', () => {
    const result = growLayers(quarterWaveOnBk7, broadbandAr, {
      allowedMaterials: allowed,
      maxLayers: 12,
      growthMerit: 'smooth',
    });
    expect(result.stoppedBy).toBe('maskMet');
    // Checked on the mask's own evaluation, not the optimiser's merit.
    const check = evaluateMask(broadbandAr, result.stack);
    expect(check.pass).toBe(true);
    expect(check.worstMargin).toBeGreaterThanOrEqual(0.001 - 1e-6);
    expect(check.worstMargin).toBeCloseTo(result.final.worstMargin, 10);
    // Growing may keep thin layers; every reported step is fitted within [min, max] and the limit.
    for (const step of result.steps) {
      expect(step.layerCount).toBeLessThanOrEqual(12);
      for (const layer of step.layers) expect(layer.thicknessNm).toBeGreaterThanOrEqual(10 - 1e-9);
    }
    expect(
      growLayers(quarterWaveOnBk7, broadbandAr, {
        allowedMaterials: allowed,
        maxLayers: 12,
        growthMerit: 'smooth',
      }),
    ).toEqual(result);
  });

  it('thickens a needle-optimal design so growing on the smooth merit goes on to meet a wide band', () => {
    // 400–1100 nm at normal incidence is too wide for the 2-layer start's thickness: on the
    // one-sided merit the needles stop near 0.5 µm (needle-optimal, mask not met); on the smooth
    // merit half-wave layers on the substrate give them room.
    const wide: SpecMask = {
      step_nm: 10,
      bands: [{ from_nm: 400, to_nm: 1100, quantity: 'R', max_percent: 0.5 }],
    };
    const start: OpticalStack = {
      ...quarterWaveOnBk7,
      layers: [
        { material: MGF2, thicknessNm: 95 },
        { material: c(2.35), thicknessNm: 120 },
      ],
    };
    const options = {
      allowedMaterials: allowed,
      layerMaterials: ['MgF2', 'TiO2'],
      outermostFixed: true,
      outermostOnly: ['MgF2'],
      maxLayers: 40,
      maxSteps: 60,
    };
    const smooth = growLayers(start, wide, { ...options, growthMerit: 'smooth' });
    expect(smooth.stoppedBy).toBe('maskMet');
    expect(evaluateMask(wide, smooth.stack).pass).toBe(true);
    expect(elementAt(smooth.final.layers, 0, 'the final layers').material).toBe('MgF2');
    for (const step of smooth.steps) expect(step.layerCount).toBeLessThanOrEqual(40);
    const oneSided = growLayers(start, wide, options);
    expect(oneSided.stoppedBy).toBe('noImprovement');
    expect(oneSided.final.pass).toBe(false);
    expect(smooth.final.totalThicknessNm).toBeGreaterThan(oneSided.final.totalThicknessNm + 200);
  });

  it('has a needle function on the smooth merit that matches probing with a 0.01 nm needle', () => {
    // Independent check: the merit's change when a 0.01 nm layer is really inserted (computed
    // with the transfer matrix), divided by its thickness, against the analytic first-order value.
    const mask: SpecMask = {
      bands: [
        { from_nm: 420, to_nm: 680, step_nm: 20, quantity: 'R', max_percent: 0.5, angles_deg: [0, 40] },
      ],
    };
    const stack: OpticalStack = {
      ...quarterWaveOnBk7,
      layers: [
        { material: MGF2, thicknessNm: 92 },
        { material: c(2.35), thicknessNm: 48 },
        { material: c(1.46), thicknessNm: 30 },
      ],
    };
    const merit = createMaskMerit(stack, mask, { smooth: true });
    const d = stack.layers.map((l) => l.thicknessNm);
    const r = new Float64Array(merit.sampleCount);
    const f0 = merit.residuals(r, d);
    const gR = new Float64Array(merit.plan.size);
    const gT = new Float64Array(merit.plan.size);
    merit.gradientWeights(gR, gT);
    const nW = merit.plan.wavelengthsNm.length;
    const needle = c(2.35);
    const materials = {
      count: 1,
      epsRe: new Float64Array(nW).fill(2.35 * 2.35),
      epsIm: new Float64Array(nW),
    };
    const grid = createNeedleGrid(d, 10);
    const analytic = needleFunction(new Float64Array(grid.count), merit.plan, materials, grid, gR, gT);
    let scale = 0;
    for (let k = 0; k < grid.count; k++) {
      const j = elementAt(grid.layer, k, 'the grid layers');
      const host = elementAt(stack.layers, j, 'the layers');
      const offsetNm = elementAt(grid.offsetNm, k, 'the grid offsets');
      const probe = (thicknessNm: number) => {
        const layers = [
          ...stack.layers.slice(0, j),
          { material: host.material, thicknessNm: offsetNm },
          { material: needle, thicknessNm },
          { material: host.material, thicknessNm: host.thicknessNm - offsetNm },
          ...stack.layers.slice(j + 1),
        ];
        const probed = merit.withStack({ ...stack, layers });
        return (
          (probed.residuals(
            r,
            layers.map((l) => l.thicknessNm),
          ) -
            f0) /
          thicknessNm
        );
      };
      const coarse = probe(0.01);
      // Probing is first-order accurate: within 1e-3 of the scale at 0.01 nm, and Richardson's
      // 2·p(0.005) − p(0.01) removes the O(Δ) term.
      expect(Math.abs(elementAt(analytic, k, 'the needle function') - coarse)).toBeLessThan(
        2e-3 * Math.max(1, Math.abs(coarse)),
      );
      expect(analytic[k]).toBeCloseTo(2 * probe(0.005) - coarse, 3);
      scale = Math.max(scale, Math.abs(coarse));
    }
    expect(scale).toBeGreaterThan(1);
  });

  it('merges neighbours of one material without changing the spectrum; removal changes it to first order', () => {
    const models = new Map(allowed.map((m) => [m.name, m.model]));
    const stackOf = (list: { material: string; thicknessNm: number }[]): OpticalStack => ({
      ...quarterWaveOnBk7,
      layers: list.map((l) => ({ material: models.get(l.material) ?? MGF2, thicknessNm: l.thicknessNm })),
    });
    const grid = {
      wavelengthsNm: [400, 450, 500, 550, 600, 700, 800, 1000],
      anglesDeg: [0, 40],
      polarisations: ['avg' as const],
    };
    const withThin = (t: number) => [
      { material: 'MgF2', thicknessNm: 100 },
      { material: 'TiO2', thicknessNm: 60 },
      { material: 'SiO2', thicknessNm: 2 * t },
      { material: 'TiO2', thicknessNm: 20 },
      { material: 'SiO2', thicknessNm: 40 },
      { material: 'TiO2', thicknessNm: 3 * t },
      { material: 'SiO2', thicknessNm: 35 },
    ];
    const kept = dropThinLayers(withThin(0.1), 0.5);
    expect(kept).toEqual([
      { material: 'MgF2', thicknessNm: 100 },
      { material: 'TiO2', thicknessNm: 80 },
      { material: 'SiO2', thicknessNm: 75 },
    ]);
    // Two touching layers of one material are one layer (the characteristic matrices multiply:
    // M(d1)·M(d2) = M(d1 + d2), Macleod, ch. 2): the spectrum is the same to rounding.
    const merged = calculateSpectrum(stackOf(kept), grid);
    const split = calculateSpectrum(stackOf(withThin(0)), grid);
    for (let i = 0; i < merged.R.length; i++)
      expect(split.R[i]).toBeCloseTo(elementAt(merged.R, i, 'the merged spectrum'), 13);
    // Removing layers of thickness Δ changes R by first order in Δ: halving Δ halves the change.
    const change = (t: number) => {
      const r = calculateSpectrum(stackOf(withThin(t)), grid).R;
      return Array.from(r, (v, i) => v - elementAt(merged.R, i, 'the merged spectrum'));
    };
    const full = change(0.1);
    const half = change(0.05);
    let largest = 0;
    full.forEach((f, i) => {
      largest = Math.max(largest, Math.abs(f));
      if (Math.abs(f) > 1e-5) expect(f / elementAt(half, i, 'the halved change')).toBeCloseTo(2, 1);
    });
    expect(largest).toBeGreaterThan(1e-5);
  });

  it('rejects bad input with errors naming the field', () => {
    const cases: [() => unknown, RegExp][] = [
      [
        () => growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: [] }),
        /^allowedMaterials: must list at least one/,
      ],
      [
        () =>
          growLayers(quarterWaveOnBk7, broadbandAr, {
            allowedMaterials: [elementAt(allowed, 0, 'allowed materials'), { name: 'MgF2', model: c(1.39) }],
          }),
        /^allowedMaterials\[1\]\.name: "MgF2" is listed twice/,
      ],
      [
        () =>
          growLayers(quarterWaveOnBk7, broadbandAr, {
            allowedMaterials: [{ name: 'X', model: { model: 'constant', n: -1 } }],
          }),
        /^allowedMaterials\[0\]\.model\.n:/,
      ],
      [
        () =>
          growLayers(quarterWaveOnBk7, broadbandAr, {
            allowedMaterials: allowed,
            minThicknessNm: 50,
            maxThicknessNm: 20,
          }),
        /^minThicknessNm: must not exceed maxThicknessNm/,
      ],
      [
        () => growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayer: 5 } as never),
        /^maxLayer: is not a known field/,
      ],
      [
        () => growLayers(quarterWaveOnBk7, { bands: [] }, { allowedMaterials: allowed }),
        /^bands: must hold at least one/,
      ],
      [
        () => growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, maxLayers: 0 }),
        /^maxLayers:/,
      ],
      [
        () =>
          growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, layerMaterials: ['TiO2'] }),
        /^layerMaterials\[0\]: "TiO2" already names another material model/,
      ],
      [
        () =>
          growLayers(quarterWaveOnBk7, broadbandAr, {
            allowedMaterials: allowed,
            growthMerit: 'rms' as never,
          }),
        /^growthMerit:/,
      ],
      [
        () => growLayers(quarterWaveOnBk7, broadbandAr, { allowedMaterials: allowed, needlesPerStep: 0 }),
        /^needlesPerStep:/,
      ],
    ];
    for (const [run, message] of cases) {
      expect(run).toThrow(OpticsInputError);
      expect(run).toThrow(message);
    }
  });
});
