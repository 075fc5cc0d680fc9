import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { seededRandom } from './__tests__/random.js';
import { sinCos } from './fastmath.js';

describe('sinCos', () => {
  it('agrees with Math.sin and Math.cos (the runtime’s own functions) to a few 1e-16', () => {
    const rand = seededRandom(1);
    const out = new Float64Array(2);
    const scales = [1, 10, 1e3, 1.49e6];
    let worst = 0;
    for (let i = 0; i < 200_000; i++) {
      const scale = elementAt(scales, i % 4, 'scales');
      const x = (rand() - 0.5) * 2 * scale;
      sinCos(out, 0, x);
      const sinError = Math.abs(elementAt(out, 0, 'sinCos output') - Math.sin(x));
      const cosError = Math.abs(elementAt(out, 1, 'sinCos output') - Math.cos(x));
      worst = Math.max(worst, sinError, cosError);
    }
    expect(worst).toBeLessThan(5e-16);
  });

  it('is exact at multiples of π/2 up to the rounding of the argument', () => {
    const out = new Float64Array(4);
    sinCos(out, 2, 0);
    expect([out[2], out[3]]).toEqual([0, 1]);
    sinCos(out, 0, Math.PI / 2);
    expect(out[0]).toBe(1);
    expect(out[1]).toBeCloseTo(Math.cos(Math.PI / 2), 31);
    sinCos(out, 0, -Math.PI);
    expect(out[0]).toBeCloseTo(Math.sin(-Math.PI), 31);
    expect(out[1]).toBe(-1);
  });

  it('falls back to Math for huge and non-finite arguments', () => {
    const out = new Float64Array(2);
    sinCos(out, 0, 1e12);
    expect([out[0], out[1]]).toEqual([Math.sin(1e12), Math.cos(1e12)]);
    sinCos(out, 0, Number.NaN);
    expect(Number.isNaN(out[0]) && Number.isNaN(out[1])).toBe(true);
  });
});
