import { describe, expect, it } from 'vitest';
import { elementAt, required } from './checked.js';

describe('elementAt', () => {
  it('returns the element at the index, zero and NaN included', () => {
    expect(elementAt([0, 1.5, 2], 0, 'the thicknesses')).toBe(0);
    expect(elementAt(new Float64Array([NaN, 4]), 0, 'the values')).toBeNaN();
    expect(elementAt(['a', 'b'], 1, 'the names')).toBe('b');
  });
  it('throws, naming the array, where the index is past its end or negative', () => {
    expect(() => elementAt([1, 2], 2, 'the reflectance curve')).toThrow(
      'the reflectance curve has no element 2 (it holds 2)',
    );
    expect(() => elementAt([1, 2], -1, 'the reflectance curve')).toThrow(/has no element -1/);
  });
});

describe('required', () => {
  it('returns a value that is there, falsy ones included', () => {
    expect(required(0, 'the angle')).toBe(0);
    expect(required('', 'the label')).toBe('');
    expect(required(null, 'the note')).toBeNull();
  });
  it('throws, naming what was missing, for undefined', () => {
    expect(() => required(new Map<string, number>().get('SiO2'), 'the index of SiO2')).toThrow(
      'the index of SiO2 is missing',
    );
  });
});
