import { describe, expect, it } from 'vitest';
import { elementAt, required } from '../checked.js';
import { calculateSpectrum } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import { MATERIAL_LIBRARY } from '../optics/library.js';
import { evaluateMask, maskGrid, type SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import {
  createYieldRunner,
  forecastYield,
  mergeYieldParts,
  percentileOfSorted,
  prepareYield,
  runYieldTrials,
  type YieldOptions,
} from './yield.js';

// A 5-layer broadband AR (invented demo design) of n 1.38 / 2.35 (typical MgF2 / TiO2 values,
// common practice, from memory) on N-BK7, against R ≤ 0.6 % over 420–680 nm every 5 nm.
const MATERIALS = ['MgF2', 'TiO2', 'MgF2', 'TiO2', 'MgF2'];
const THICKNESSES = [114.4, 19.2, 54.3, 12.8, 184.5];
const models: Record<string, ReturnType<typeof c>> = { MgF2: c(1.38), TiO2: c(2.35) };
const design: OpticalStack = {
  incident: c(1),
  layers: MATERIALS.map((m, i) => ({
    material: required(models[m], `model of ${m}`),
    thicknessNm: elementAt(THICKNESSES, i, 'thicknesses'),
  })),
  substrate: required(MATERIAL_LIBRARY['N-BK7'], 'library material N-BK7'),
  backLayers: [],
  exit: c(1),
};
const mask: SpecMask = { bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.6, step_nm: 5 }] };
const base: YieldOptions = { trials: 400, seed: 11, layerMaterials: MATERIALS, sensitivityTrials: 100 };

describe('Yield forecast', () => {
  it('gives 100 % with zero error when the nominal design passes, every trial at the nominal margin', () => {
    const nominal = evaluateMask(mask, design);
    expect(nominal.pass).toBe(true);
    const result = forecastYield(design, mask, { ...base, thickness: { relativePercent: 0, absoluteNm: 0 } });
    expect(result.yieldFraction).toBe(1);
    expect(result.passed).toBe(400);
    expect(result.nominal.worstMargin).toBeCloseTo(nominal.worstMargin, 12);
    expect(result.worstMargins.min).toBe(result.worstMargins.max);
    expect(result.worstMargins.min).toBeCloseTo(nominal.worstMargin, 12);
    for (const s of result.sensitivity) {
      expect(s.yieldLossFraction).toBe(0);
      expect(s.marginLossPercent).toBe(0);
    }
    // With no error every percentile of the envelope is the nominal spectrum (computed directly).
    const direct = calculateSpectrum(design, maskGrid(mask));
    const envelope = elementAt(result.envelopes, 0, 'envelopes');
    expect(envelope.wavelengthsNm).toHaveLength(53);
    for (const p of envelope.percentiles) {
      p.values.forEach((v, i) => expect(v).toBeCloseTo(100 * elementAt(direct.R, i, 'R'), 12));
    }
  });

  it('gives 0 % with zero error when the nominal design fails', () => {
    const strict: SpecMask = { bands: [{ ...elementAt(mask.bands, 0, 'mask bands'), max_percent: 0.05 }] };
    const result = forecastYield(design, strict, { ...base, thickness: { relativePercent: 0 } });
    expect(result.nominal.pass).toBe(false);
    expect(result.yieldFraction).toBe(0);
  });

  it('falls monotonically as the thickness error grows', () => {
    const yields = [0.5, 1, 2, 4].map(
      (relativePercent) =>
        forecastYield(design, mask, { ...base, thickness: { relativePercent } }).yieldFraction,
    );
    for (let i = 1; i < yields.length; i++)
      expect(yields[i]).toBeLessThan(elementAt(yields, i - 1, 'yields'));
    expect(yields[0]).toBeGreaterThan(0.5);
    expect(yields[3]).toBeLessThan(0.3);
  });

  it('is reproducible: the same seed gives the same result, another seed another sample', () => {
    const options = { ...base, thickness: { relativePercent: 1, absoluteNm: 0.5 } };
    const first = forecastYield(design, mask, options);
    expect(forecastYield(design, mask, options)).toEqual(first);
    const other = forecastYield(design, mask, { ...options, seed: 12 });
    expect(other.worstMargins.mean).not.toBe(first.worstMargins.mean);
  });

  it('gives the same forecast when the trials are split into parts and merged, in any order', () => {
    const options: YieldOptions = {
      ...base,
      thickness: { relativePercent: 1, absoluteNm: 0.3, distribution: 'uniform' },
      systematic: { TiO2: { relativePercent: 0.5 } },
      indexErrors: { MgF2: { relativePercent: 0.3 }, TiO2: { relativePercent: 0.6 } },
      envelopeTrials: 150,
    };
    const whole = forecastYield(design, mask, options);
    const job = prepareYield(design, mask, options);
    const runner = createYieldRunner(job);
    const parts = [runner.run(237, 400), runYieldTrials(job, 0, 37), runner.run(37, 99), runner.run(99, 237)];
    expect(mergeYieldParts(job, parts)).toEqual(whole);
    expect(() => mergeYieldParts(job, [elementAt(parts, 1, 'parts'), elementAt(parts, 3, 'parts')])).toThrow(
      /^parts: must cover trials from 0/,
    );
  });

  it('applies index and systematic errors per material', () => {
    const indexOnly = forecastYield(design, mask, { ...base, indexErrors: { TiO2: { relativePercent: 3 } } });
    expect(indexOnly.yieldFraction).toBeLessThan(1);
    // index errors do not enter the single-layer thickness runs
    for (const s of indexOnly.sensitivity) expect(s.yieldLossFraction).toBe(0);
    const systematic = forecastYield(design, mask, { ...base, systematic: { MgF2: { relativePercent: 2 } } });
    expect(systematic.yieldFraction).toBeLessThan(1);
    // the TiO2 layers carry no error in that forecast
    for (const s of systematic.sensitivity.filter((x) => x.material === 'TiO2'))
      expect(s.marginLossPercent).toBe(0);
  });

  it('ranks the layers by the yield their error costs; an index-matched layer costs nothing', () => {
    // A layer of the substrate's own index next to the substrate has no interface and so no
    // optical effect (Fresnel: r = 0 between equal indices; Hecht, ch. 4).
    const substrate = c(1.52);
    const withMatched: OpticalStack = {
      ...design,
      substrate,
      layers: [...design.layers, { material: substrate, thicknessNm: 80 }],
    };
    const result = forecastYield(withMatched, mask, {
      ...base,
      layerMaterials: [...MATERIALS, 'glass'],
      thickness: { relativePercent: 2 },
    });
    const sensitivity = (i: number) => elementAt(result.sensitivity, i, 'sensitivity');
    const last = sensitivity(result.sensitivity.length - 1);
    expect(last.layer).toBe(5);
    expect(last.yieldLossFraction).toBe(0);
    expect(Math.abs(last.marginLossPercent)).toBeLessThan(1e-12);
    expect(sensitivity(0).yieldLossFraction).toBeGreaterThan(0.05);
    for (let i = 1; i < result.sensitivity.length; i++) {
      expect(sensitivity(i).yieldLossFraction).toBeLessThanOrEqual(sensitivity(i - 1).yieldLossFraction);
    }
  });

  it('orders the envelope percentiles and counts every trial in the margin histogram', () => {
    const result = forecastYield(design, mask, {
      ...base,
      thickness: { relativePercent: 2 },
      percentiles: [5, 50, 95],
    });
    const percentiles = elementAt(result.envelopes, 0, 'envelopes').percentiles;
    const p5 = elementAt(percentiles, 0, 'percentiles');
    const p50 = elementAt(percentiles, 1, 'percentiles');
    const p95 = elementAt(percentiles, 2, 'percentiles');
    for (let i = 0; i < p5.values.length; i++) {
      expect(p5.values[i]).toBeLessThanOrEqual(elementAt(p50.values, i, 'P50 values'));
      expect(p50.values[i]).toBeLessThanOrEqual(elementAt(p95.values, i, 'P95 values'));
    }
    expect(p95.values.some((v, i) => v > elementAt(p5.values, i, 'P5 values') + 0.01)).toBe(true);
    const hist = result.worstMargins.histogram;
    expect(hist.counts.reduce((a, b) => a + b, 0)).toBe(400);
    expect(hist.edges[0]).toBe(result.worstMargins.min);
    expect(hist.edges[hist.edges.length - 1]).toBe(result.worstMargins.max);
    const passingFraction = result.passed / result.trials;
    expect(result.yieldFraction).toBe(passingFraction);
  });

  it('computes percentiles by linear interpolation between order statistics', () => {
    // Hyndman & Fan (1996) type 7, the default of R's quantile(): quantile(1:4, 0.25) = 1.75.
    expect(percentileOfSorted([1, 2, 3, 4], 25)).toBe(1.75);
    expect(percentileOfSorted([1, 2, 3, 4], 0)).toBe(1);
    expect(percentileOfSorted([1, 2, 3, 4], 100)).toBe(4);
    expect(percentileOfSorted([10, 20, 30, 40, 50], 90)).toBe(46);
  });

  it('stops when progress says so, with the trials done so far', () => {
    const result = forecastYield(design, mask, { ...base, trials: 1000, onProgress: () => false });
    expect(result.stoppedBy).toBe('cancelled');
    expect(result.trials).toBe(250);
    expect(result.requestedTrials).toBe(1000);
    const fractions: number[] = [];
    forecastYield(design, mask, { ...base, trials: 600, onProgress: (f) => void fractions.push(f) });
    expect(fractions).toEqual([250 / 600, 500 / 600, 1]);
  });

  it('rejects bad input with errors naming the field', () => {
    const cases: [YieldOptions | (() => unknown), RegExp][] = [
      [{ trials: 0 }, /^trials: must be a whole number from 1 to 100000 \(got 0\)/],
      [{ trials: 100_001 }, /^trials: must be a whole number from 1 to 100000/],
      [{ trials: 2.5 }, /^trials:/],
      [{ seed: -1 }, /^seed:/],
      [{ thickness: { relativePercent: -1 } }, /^thickness\.relativePercent: must be 0 or more/],
      [{ thickness: { distribution: 'gauss' as 'normal' } }, /^thickness\.distribution: must be one of/],
      [{ indexErrors: { MgF2: { relativePercent: 1 } } }, /^layerMaterials: is required with indexErrors/],
      [
        { layerMaterials: MATERIALS, indexErrors: { ZnS: { relativePercent: 1 } } },
        /^indexErrors\.ZnS: no layer is of material "ZnS"/,
      ],
      [{ layerMaterials: ['MgF2'] }, /^layerMaterials: must list 5 material names/],
      [{ percentiles: [5, 120] }, /^percentiles\[1\]: must lie between 0 and 100/],
      [{ trials: 100, envelopeTrials: 101 }, /^envelopeTrials:/],
      [{ trials: 100, sensitivityTrials: -1 }, /^sensitivityTrials:/],
      [() => forecastYield({ ...design, layers: [] }, mask), /^layers: the stack has no layers to perturb/],
      [() => forecastYield(design, { bands: [] }), /^bands: must hold at least one limit band/],
      [
        () => createYieldRunner(prepareYield(design, mask, { trials: 10 })).run(5, 11),
        /^from: trials \[5, 11\)/,
      ],
    ];
    for (const [input, message] of cases) {
      const run = typeof input === 'function' ? input : () => forecastYield(design, mask, input);
      expect(run).toThrow(OpticsInputError);
      expect(run).toThrow(message);
    }
  });
});
