/// <reference types="node" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import {
  forecastYield,
  mergeYieldParts,
  prepareYield,
  runYieldTrials,
  type YieldOptions,
} from '../optimise/yield.js';
import { YieldWorkerPool, forecastYieldParallel } from './yield-parallel.js';

// Invented demo design: 4-layer AR of n 1.38 / 2.35 on n 1.52, mask R ≤ 0.8 % over 430–670 nm.
const stack: OpticalStack = {
  incident: c(1),
  layers: [95, 120, 35, 15].map((d, i) => ({ material: i % 2 === 0 ? c(1.38) : c(2.35), thicknessNm: d })),
  substrate: c(1.52),
  backLayers: [],
  exit: c(1),
};
const mask: SpecMask = { bands: [{ from_nm: 430, to_nm: 670, quantity: 'R', max_percent: 0.8, step_nm: 4 }] };
const options: YieldOptions = {
  trials: 900,
  seed: 5,
  thickness: { relativePercent: 1.5, absoluteNm: 0.3 },
  layerMaterials: ['L', 'H', 'L', 'H'],
  systematic: { H: { relativePercent: 0.5 } },
  indexErrors: { L: { relativePercent: 0.4 } },
  sensitivityTrials: 200,
  envelopeTrials: 300,
};

describe('YieldWorkerPool', () => {
  let pool: YieldWorkerPool;
  beforeAll(async () => {
    pool = await YieldWorkerPool.create({ size: 2 });
  });
  afterAll(async () => {
    await pool.close();
  });

  it('gives exactly the single-thread forecast, split across two workers', async () => {
    const one = forecastYield(stack, mask, options);
    expect(one.yieldFraction).toBeGreaterThan(0);
    expect(one.yieldFraction).toBeLessThan(1);
    const fractions: number[] = [];
    const two = await pool.forecast(stack, mask, { ...options, onProgress: (f) => void fractions.push(f) });
    expect(pool.size).toBe(2);
    expect(two).toEqual(one);
    expect(fractions[fractions.length - 1]).toBe(1);
    for (let i = 1; i < fractions.length; i++) {
      expect(fractions[i]).toBeGreaterThan(elementAt(fractions, i - 1, 'fractions'));
    }
  });

  it('stops handing out trials when progress says so, keeping the trials from the first on', async () => {
    const stopped = await pool.forecast(stack, mask, { ...options, onProgress: () => false });
    expect(stopped.stoppedBy).toBe('cancelled');
    expect(stopped.trials).toBeGreaterThan(0);
    expect(stopped.trials).toBeLessThan(900);
    // the same as those first trials run in one thread
    const job = prepareYield(stack, mask, options);
    expect(stopped).toEqual(mergeYieldParts(job, [runYieldTrials(job, 0, stopped.trials)]));
  });

  it('rejects bad input with the same OpticsInputError as one thread', async () => {
    await expect(pool.forecast(stack, mask, { trials: 0 })).rejects.toThrow(OpticsInputError);
    await expect(pool.forecast(stack, mask, { trials: 0 })).rejects.toThrow(/^trials:/);
  });

  it('runs one-off through forecastYieldParallel', async () => {
    const small = { ...options, trials: 120, sensitivityTrials: 20, envelopeTrials: 20 };
    expect(await forecastYieldParallel(stack, mask, small, { size: 2 })).toEqual(
      forecastYield(stack, mask, small),
    );
  });
});
