import { describe, expect, it } from 'vitest';
import { plotRangeForMask } from './plot-range.js';

// The rule is the shop's own: common practice (no source).
describe('plotRangeForMask', () => {
  it('covers a visible band and an 840–880 nm band with a margin and the union of their angles', () => {
    const range = plotRangeForMask([
      { from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, angles_deg: [0, 30] },
      { from_nm: 840, to_nm: 880, quantity: 'R', max_percent: 1, angles_deg: [15, 0] },
    ]);
    // span 460 nm → margin 46 nm; 374 → 370, 926 → 930
    expect(range).toEqual({ fromNm: 370, toNm: 930, anglesDeg: [0, 15, 30] });
  });

  it('uses at least 20 nm of margin for a narrow band and defaults the angle to 0°', () => {
    expect(plotRangeForMask([{ from_nm: 1064, to_nm: 1064, quantity: 'R', max_percent: 0.2 }])).toEqual({
      fromNm: 1040,
      toNm: 1090,
      anglesDeg: [0],
    });
  });

  it('falls back to 380–780 nm at 0° without a mask', () => {
    expect(plotRangeForMask(null)).toEqual({ fromNm: 380, toNm: 780, anglesDeg: [0] });
    expect(plotRangeForMask([])).toEqual({ fromNm: 380, toNm: 780, anglesDeg: [0] });
  });

  it('keeps at most six angles', () => {
    const range = plotRangeForMask([
      { from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 1, angles_deg: [0, 10, 20, 30, 40, 50, 60] },
    ]);
    expect(range.anglesDeg).toEqual([0, 10, 20, 30, 40, 50]);
  });
});
