import { describe, expect, it } from 'vitest';
import { formatToolingFactor, keptToolingFactor, keptToolingFactors } from './chambers.js';

describe('formatToolingFactor', () => {
  it('prints three decimals, and every further decimal the stored factor has (up to six)', () => {
    expect(formatToolingFactor(1)).toBe('1.000');
    expect(formatToolingFactor(1.04)).toBe('1.040');
    expect(formatToolingFactor(0.97)).toBe('0.970');
    // A calibration rounds the proposed factor to four decimals: the sheet shows all four.
    expect(formatToolingFactor(0.9914)).toBe('0.9914');
    expect(formatToolingFactor(1.23456)).toBe('1.23456');
    expect(formatToolingFactor(1 / 3)).toBe('0.333333');
  });
});

describe('keptToolingFactors', () => {
  it('keeps each material’s factor under its id and reads it back; none kept reads as undefined', () => {
    const kept = keptToolingFactors([
      { materialId: 4, toolingFactor: 0.9914, rateNmPerS: 0.4 },
      { materialId: 7, toolingFactor: 1.04, rateNmPerS: 0.8 },
    ]);
    expect(JSON.parse(JSON.stringify(kept))).toEqual({ '4': 0.9914, '7': 1.04 });
    expect(keptToolingFactor(kept, 4)).toBe(0.9914);
    expect(keptToolingFactor(kept, 9)).toBeUndefined();
    expect(keptToolingFactor(null, 4)).toBeUndefined();
  });
});
