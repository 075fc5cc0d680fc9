import { describe, expect, it } from 'vitest';
import { elementAt, required } from '../checked.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import { MATERIAL_LIBRARY } from '../optics/library.js';
import { evaluateMask, type SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
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
    ];
    for (const [run, message] of cases) {
      expect(run).toThrow(OpticsInputError);
      expect(run).toThrow(message);
    }
  });
});
