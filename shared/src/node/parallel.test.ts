/// <reference types="node" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { calculateSpectrum } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import type { OpticalStack } from '../optics/stack.js';
import { SpectrumWorkerPool, computeSpectrumParallel } from './parallel.js';

const stack: OpticalStack = {
  incident: c(1),
  layers: Array.from({ length: 8 }, (_, j) => ({
    material: j % 2 === 0 ? c(2.35, 0.0001) : c(1.46),
    thicknessNm: 50 + 7 * j,
  })),
  substrate: c(1.52, 1e-7),
  substrateThicknessMm: 1,
  backLayers: [{ material: c(1.38), thicknessNm: 100 }],
  exit: c(1),
};
const grid = {
  wavelengthsNm: Array.from({ length: 101 }, (_, i) => 400 + 3 * i),
  anglesDeg: [0, 20, 45, 70],
  polarisations: ['s' as const, 'p' as const, 'avg' as const],
};

describe('SpectrumWorkerPool', () => {
  let pool: SpectrumWorkerPool;
  beforeAll(async () => {
    pool = await SpectrumWorkerPool.create({ size: 2 });
  });
  afterAll(async () => {
    await pool.close();
  });

  it('gives exactly the single-thread result, split across two workers', async () => {
    for (const back of ['none', 'incoherent'] as const) {
      const one = calculateSpectrum(stack, grid, { back });
      const two = await pool.compute(stack, grid, { back });
      expect(pool.size).toBe(2);
      expect(two.R.buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(Array.from(two.R)).toEqual(Array.from(one.R));
      expect(Array.from(two.T)).toEqual(Array.from(one.T));
      expect(Array.from(two.A)).toEqual(Array.from(one.A));
    }
  });

  it('computes the complex amplitudes too, and handles fewer wavelengths than workers', async () => {
    const small = { wavelengthsNm: [550], anglesDeg: [0, 30], polarisations: ['s' as const, 'p' as const] };
    const one = calculateSpectrum(stack, small, { amplitudes: true });
    const two = await pool.compute(stack, small, { amplitudes: true });
    expect(Array.from(two.r as Float64Array)).toEqual(Array.from(one.r as Float64Array));
    expect(Array.from(two.t as Float64Array)).toEqual(Array.from(one.t as Float64Array));
  });

  it('rejects bad input with the same OpticsInputError as one thread', async () => {
    await expect(pool.compute(stack, { ...grid, anglesDeg: [95] })).rejects.toThrow(OpticsInputError);
    await expect(pool.compute(stack, { ...grid, anglesDeg: [95] })).rejects.toThrow(/^anglesDeg\[0\]/);
  });

  it('runs one-off through computeSpectrumParallel', async () => {
    const res = await computeSpectrumParallel(stack, grid, {}, { size: 2 });
    expect(Array.from(res.R)).toEqual(Array.from(calculateSpectrum(stack, grid).R));
  });
});
