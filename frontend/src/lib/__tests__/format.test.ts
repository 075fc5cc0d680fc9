import { describe, expect, it } from 'vitest';
import { formatSigned } from '../format';

describe('formatSigned', () => {
  it('writes margins with a plus sign or a true minus sign (U+2212) and a fixed count of decimals', () => {
    expect(formatSigned(0.1184)).toBe('+0.118');
    expect(formatSigned(-0.2)).toBe('\u22120.200');
    expect(formatSigned(0)).toBe('+0.000');
    expect(formatSigned(-5, 2)).toBe('\u22125.00');
  });
});
