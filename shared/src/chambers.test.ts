import { describe, expect, it } from 'vitest';
import { formatToolingFactor } from './chambers.js';

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
