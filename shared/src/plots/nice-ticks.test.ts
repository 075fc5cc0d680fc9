import { describe, expect, it } from 'vitest';
import { niceNumber, niceTicks } from './nice-ticks.js';

// P. S. Heckbert, "Nice numbers for graph labels", Graphics Gems (1990): steps are 1, 2 or 5 × 10^k,
// axis ends are multiples of the step at or beyond the data (loose labelling).
describe('niceNumber', () => {
  it('rounds to 1, 2, 5 or 10 times a power of ten', () => {
    expect(niceNumber(1.4, true)).toBe(1);
    expect(niceNumber(2.9, true)).toBe(2);
    expect(niceNumber(6.9, true)).toBe(5);
    expect(niceNumber(7, true)).toBe(10);
    expect(niceNumber(0.0031, true)).toBeCloseTo(0.005, 12);
    expect(niceNumber(236, false)).toBe(500);
    expect(niceNumber(200, false)).toBe(200);
  });
});

describe('niceTicks', () => {
  it('labels 429–665 nm with steps of 50 nm instead of odd values', () => {
    const t = niceTicks(429, 665, 6);
    // range 236 → nice 500; 500 / 5 = 100 → rounds to 100
    expect(t).toEqual({ min: 400, max: 700, step: 100, ticks: [400, 500, 600, 700], decimals: 0 });
    // 500 / 10 = 50 → 50
    expect(niceTicks(429, 665, 11).ticks).toEqual([400, 450, 500, 550, 600, 650, 700]);
  });

  it('labels 0–1.6 % reflectance in steps of 0.5 without floating-point noise', () => {
    const t = niceTicks(0, 1.6, 5);
    expect(t.ticks).toEqual([0, 0.5, 1, 1.5, 2]);
    expect(t.decimals).toBe(1);
    // range 0.3 → nice 0.5; 0.5 / 3 = 0.167 → 0.2
    expect(niceTicks(0, 0.3, 4).ticks).toEqual([0, 0.2, 0.4]);
  });

  it('widens an empty range and refuses bad input', () => {
    expect(niceTicks(5, 5, 3).ticks).toEqual([4, 5, 6]);
    expect(() => niceTicks(0, Number.NaN)).toThrow(/finite/);
    expect(() => niceTicks(0, 1, 1)).toThrow(/count/);
  });
});
