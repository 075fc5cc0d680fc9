import { describe, expect, it } from 'vitest';
import { describeBand, forbiddenRegions } from '../mask-regions';

// A band's bound (validateSpecMask in shared/src/optics/mask.ts): a maximum forbids values above
// it, a minimum values below, a target everything outside target ± tolerance.

describe('forbidden regions of a spec mask', () => {
  it('shades above a maximum, below a minimum and outside a target tolerance', () => {
    const regions = forbiddenRegions(
      [
        { from_nm: 420, to_nm: 680, angles_deg: [0, 15, 30], quantity: 'R', max_percent: 0.5 },
        { from_nm: 500, to_nm: 600, quantity: 'T', min_percent: 95 },
        {
          from_nm: 532,
          to_nm: 532,
          quantity: 'R',
          target_percent: 0.2,
          tolerance_percent: 0.1,
          label: 'laser line',
        },
      ],
      100,
    );
    expect(regions.map(({ label: _label, ...r }) => r)).toEqual([
      { quantity: 'R', fromNm: 420, toNm: 680, lowPercent: 0.5, highPercent: 100 },
      { quantity: 'T', fromNm: 500, toNm: 600, lowPercent: 0, highPercent: 95 },
      { quantity: 'R', fromNm: 531.5, toNm: 532.5, lowPercent: 0, highPercent: 0.1 },
      { quantity: 'R', fromNm: 531.5, toNm: 532.5, lowPercent: 0.30000000000000004, highPercent: 100 },
    ]);
    expect(regions[0]!.label).toBe('R ≤ 0.5 % (420–680 nm, 0, 15, 30°, avg)');
  });

  it('describes a target band with its label', () => {
    expect(
      describeBand({
        from_nm: 532,
        to_nm: 532,
        quantity: 'R',
        target_percent: 0.2,
        tolerance_percent: 0.1,
        label: 'laser line',
      }),
    ).toBe('laser line: R = 0.2 ± 0.1 % (532–532 nm, 0°, avg)');
  });

  it('describes an angle range as a range and names the design margin apart from the limit', () => {
    expect(
      describeBand({
        from_nm: 450,
        to_nm: 650,
        angles_deg: [0, 5, 10, 15, 20],
        angle_from_deg: 0,
        angle_to_deg: 20,
        angle_step_deg: 5,
        quantity: 'R',
        max_percent: 0.5,
        margin_percent: 0.1,
      }),
    ).toBe('R ≤ 0.5 % (450–650 nm, 0–20 every 5°, avg); design margin 0.1 % points');
  });
});
