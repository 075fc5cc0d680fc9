import { describe, expect, it } from 'vitest';
import { bestAndMedian, median, percentile } from './stats.js';

describe('benchmark statistics', () => {
  it('takes nearest-rank percentiles and the upper middle as median', () => {
    const sorted = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(percentile(sorted, 50)).toBe(6);
    expect(percentile(sorted, 95)).toBe(10);
    expect(percentile(sorted, 0)).toBe(1);
    expect(median([5, 1, 3])).toBe(3);
    expect(bestAndMedian([0.3, 0.1, 0.2, 0.4])).toEqual({ best: 0.1, median: 0.3 });
  });

  it('names what is missing instead of computing with undefined', () => {
    expect(() => median([])).toThrow('a sample is missing');
  });
});
