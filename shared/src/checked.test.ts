import { describe, expect, it } from 'vitest';
import { elementAt, required } from './checked.js';

describe('elementAt', () => {
  it('returns the element at the index, zero and NaN included', () => {
    expect(elementAt([0, 1.5, 2], 0, 'the thicknesses')).toBe(0);
    expect(elementAt(new Float64Array([NaN, 4]), 0, 'the values')).toBeNaN();
    expect(elementAt(['a', 'b'], 1, 'the names')).toBe('b');
  });
  it('throws, naming the array, where the index is past its end or negative', () => {
    expect(() => elementAt([1, 2], 2, 'the fitted thicknesses')).toThrow(
      'the fitted thicknesses has no element 2 (it holds 2)',
    );
    expect(() => elementAt([1, 2], -1, 'the fitted thicknesses')).toThrow(/has no element -1/);
  });
});

describe('required', () => {
  it('passes present values through, falsy ones included', () => {
    expect(required(0, 'zero')).toBe(0);
    expect(required('', 'an empty name')).toBe('');
    expect(required(null, 'a null')).toBeNull();
  });
  it('names what is missing', () => {
    expect(() => required(undefined, 'the demo customer')).toThrow('the demo customer is missing');
  });
});
