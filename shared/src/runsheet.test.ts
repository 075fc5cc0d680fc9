import { describe, expect, it } from 'vitest';
import { buildRunSheet, turningPoints, type RunSheetInput } from './runsheet.js';
import { OpticsInputError } from './optics/errors.js';
import { elementAt, required } from './checked.js';

const constant = (n: number) => ({ model: 'constant' as const, n, k: 0 });
const chip = constant(1.52);

/** A 4-layer recipe with round numbers so every figure can be checked by hand. */
const recipe: RunSheetInput = {
  layers: [
    { material: 'L', model: constant(1.5), thicknessNm: 120 }, // outermost
    { material: 'H', model: constant(2.0), thicknessNm: 60 },
    { material: 'L', model: constant(1.5), thicknessNm: 30 },
    { material: 'H', model: constant(2.0), thicknessNm: 15 }, // next to the substrate
  ],
  monitorChip: chip,
  chamber: {
    monitorWavelengthNm: 600,
    materials: { L: { toolingFactor: 1.2, rateNmPerS: 0.5 }, H: { toolingFactor: 0.75, rateNmPerS: 0.25 } },
  },
  samplesPerLayer: 400,
};

describe('run sheet numbers (hand calculation)', () => {
  const sheet = buildRunSheet(recipe);

  it('lists layers in deposition order, from the substrate outwards', () => {
    expect(sheet.layers.map((l) => [l.step, l.designLayer, l.material])).toEqual([
      [1, 4, 'H'],
      [2, 3, 'L'],
      [3, 2, 'H'],
      [4, 1, 'L'],
    ]);
  });

  it('monitor thickness = part ÷ tooling factor; QWOT = 4·n·d/λ at the monitor; time = d ÷ rate', () => {
    // Layer 4 (H, 15 nm on the part, TF 0.75): 15 / 0.75 = 20 nm on the monitor;
    // QWOT = 4 · 2.0 · 20 / 600 = 0.26667; time = 20 / 0.25 = 80 s.
    const first = elementAt(sheet.layers, 0, 'run sheet layers');
    expect(first.monitorThicknessNm).toBeCloseTo(20, 12);
    expect(first.qwotAtMonitor).toBeCloseTo(0.266667, 5);
    expect(first.timeS).toBeCloseTo(80, 12);
    // Layer 1 (L, 120 nm, TF 1.2): 100 nm; QWOT = 4 · 1.5 · 100 / 600 = 1; time = 100 / 0.5 = 200 s.
    const last = elementAt(sheet.layers, 3, 'run sheet layers');
    expect(last.monitorThicknessNm).toBeCloseTo(100, 12);
    expect(last.qwotAtMonitor).toBeCloseTo(1, 12);
    expect(last.timeS).toBeCloseTo(200, 12);
    // Totals: part 225 nm; monitor 20 + 25 + 80 + 100 = 225 nm; time 80 + 50 + 320 + 200 = 650 s.
    expect(sheet.totals.partThicknessNm).toBeCloseTo(225, 12);
    expect(sheet.totals.monitorThicknessNm).toBeCloseTo(225, 12);
    expect(sheet.totals.timeS).toBeCloseTo(650, 12);
    expect(sheet.convention).toMatch(/thickness on the part ÷ thickness on the monitor/);
    expect(sheet.cautions.join(' ')).toMatch(/X-rays/);
  });

  it('the bare chip transmits the uncoated plate value (1 − R)/(1 + R) = 0.918318 for n = 1.52 (Macleod, Thin-Film Optical Filters, ch. 2)', () => {
    expect(elementAt(sheet.layers, 0, 'run sheet layers').monitor.T[0]).toBeCloseTo(0.918318, 6);
  });
});

describe('monitor turning points fall at quarter-wave optical thicknesses (Macleod, optical monitoring; chapter from memory)', () => {
  it('a first layer on the chip turns at m·λ/(4n)', () => {
    const qw = 600 / (4 * 2.35);
    const sheet = buildRunSheet({
      layers: [{ material: 'H', model: constant(2.35), thicknessNm: 3 * qw }],
      monitorChip: chip,
      chamber: { monitorWavelengthNm: 600, materials: { H: { toolingFactor: 1, rateNmPerS: 0.3 } } },
      samplesPerLayer: 600,
    });
    const layer = elementAt(sheet.layers, 0, 'run sheet layers');
    const tp = layer.turningPointsNm;
    expect(tp).toHaveLength(2);
    expect(tp[0]).toBeCloseTo(qw, 1);
    expect(tp[1]).toBeCloseTo(2 * qw, 1);
    // A high-index quarter wave on glass lowers T: the first turning point is a minimum.
    const T = layer.monitor.T;
    expect(Math.min(...T)).toBeLessThan(elementAt(T, 0, 'monitor T'));
  });

  it('on top of a quarter-wave stack, the next layer turns at its own quarter wave', () => {
    const qwH = 600 / (4 * 2.35);
    const qwL = 600 / (4 * 1.46);
    const sheet = buildRunSheet({
      layers: [
        { material: 'L', model: constant(1.46), thicknessNm: 2 * qwL },
        { material: 'H', model: constant(2.35), thicknessNm: qwH },
      ],
      monitorChip: chip,
      chamber: {
        monitorWavelengthNm: 600,
        materials: { H: { toolingFactor: 1, rateNmPerS: 0.3 }, L: { toolingFactor: 1, rateNmPerS: 0.6 } },
      },
      samplesPerLayer: 600,
    });
    const second = elementAt(sheet.layers, 1, 'run sheet layers');
    expect(second.material).toBe('L');
    expect(second.turningPointsNm).toHaveLength(1);
    expect(second.turningPointsNm[0]).toBeCloseTo(qwL, 1);
  });

  it('turningPoints refines a sampled extremum by a parabola', () => {
    const x = [0, 1, 2, 3, 4];
    const y = x.map((v) => -((v - 2.3) ** 2));
    expect(turningPoints(x, y)[0]).toBeCloseTo(2.3, 12);
  });
});

describe('run sheet errors', () => {
  it('names the layer whose material the chamber does not know, and bad tooling factors', () => {
    const missing = {
      ...recipe,
      chamber: {
        monitorWavelengthNm: 600,
        materials: { L: required(recipe.chamber.materials.L, 'chamber settings for L') },
      },
    };
    expect(() => buildRunSheet(missing)).toThrow(OpticsInputError);
    expect(() => buildRunSheet(missing)).toThrow(
      'layers[3]: the chamber has no tooling factor and rate for H',
    );
    const zero = {
      ...recipe,
      chamber: {
        ...recipe.chamber,
        materials: { ...recipe.chamber.materials, H: { toolingFactor: 0, rateNmPerS: 1 } },
      },
    };
    expect(() => buildRunSheet(zero)).toThrow('tooling factor for H must be > 0');
    expect(() => buildRunSheet({ ...recipe, layers: [] })).toThrow('a run sheet needs at least one layer');
  });
});
