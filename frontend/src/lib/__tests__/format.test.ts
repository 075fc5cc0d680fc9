import { describe, expect, it } from 'vitest';
import { formatFileSize, formatSigned, formatSizeLimit } from '../format';

describe('formatSigned', () => {
  it('writes margins with a plus sign or a true minus sign (U+2212) and a fixed count of decimals', () => {
    expect(formatSigned(0.1184)).toBe('+0.118');
    expect(formatSigned(-0.2)).toBe('\u22120.200');
    expect(formatSigned(0)).toBe('+0.000');
    expect(formatSigned(-5, 2)).toBe('\u22125.00');
  });
});

describe('file sizes', () => {
  it('writes limits without trailing zeros and sizes with a fixed count of decimals (decimal units)', () => {
    expect([200_000, 1_000_000, 2_000_000, 1_500_000, 512].map(formatSizeLimit)).toEqual([
      '200 kB',
      '1 MB',
      '2 MB',
      '1.5 MB',
      '512 bytes',
    ]);
    expect([1, 812, 12_400, 1_250_000].map(formatFileSize)).toEqual([
      '1 byte',
      '812 bytes',
      '12.4 kB',
      '1.25 MB',
    ]);
  });
});
