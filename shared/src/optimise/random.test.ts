import { describe, expect, it } from 'vitest';
import { seededRandom } from '../optics/__tests__/random.js';
import { Mulberry32, drawsFor, fillDeviates } from './random.js';

describe('seeded random numbers', () => {
  it('is mulberry32: the same stream as the property tests’ generator', () => {
    const reference = seededRandom(12345);
    const stream = new Mulberry32(12345);
    for (let i = 0; i < 1000; i++) expect(stream.nextUint32() / 4294967296).toBe(reference());
  });

  it('jumps to any position of the stream', () => {
    const walked = new Mulberry32(99);
    const values: number[] = [];
    for (let i = 0; i < 500; i++) values.push(walked.nextUint32());
    const jumped = new Mulberry32(99);
    jumped.seek(321);
    expect(jumped.nextUint32()).toBe(values[321]);
    jumped.seek(0);
    expect(jumped.nextUint32()).toBe(values[0]);
  });

  it('gives standard normal deviates (Box–Muller) with mean 0 and variance 1', () => {
    // Sample of n = 200 000: the mean's standard error is 1/√n = 0.0022, the variance's √(2/n) =
    // 0.0032; 5 standard errors are allowed. P(|z| > 1.96) = 5 % for a standard normal.
    const n = 200_000;
    const z = new Float64Array(n);
    fillDeviates(z, n, new Mulberry32(7), 'normal');
    let sum = 0;
    let squares = 0;
    let beyond = 0;
    for (const v of z) {
      sum += v;
      squares += v * v;
      if (Math.abs(v) > 1.96) beyond++;
    }
    const mean = sum / n;
    expect(Math.abs(mean)).toBeLessThan(5 * 0.0022);
    expect(Math.abs(squares / n - mean * mean - 1)).toBeLessThan(5 * 0.0032);
    expect(Math.abs(beyond / n - 0.05)).toBeLessThan(5 * Math.sqrt((0.05 * 0.95) / n));
  });

  it('gives uniform deviates on (−1, 1) with variance 1/3, from the same number of draws', () => {
    const n = 200_001;
    const z = new Float64Array(n);
    const random = new Mulberry32(8);
    fillDeviates(z, n, random, 'uniform');
    let squares = 0;
    for (const v of z) {
      expect(v > -1 && v < 1).toBe(true);
      squares += v * v;
    }
    expect(Math.abs(squares / n - 1 / 3)).toBeLessThan(0.005);
    // 2·⌈n/2⌉ draws were taken: the next draw is number 200 002 of the stream.
    const after = random.nextUint32();
    const check = new Mulberry32(8);
    check.seek(drawsFor(n));
    expect(check.nextUint32()).toBe(after);
  });
});
