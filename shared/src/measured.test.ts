import { describe, expect, it } from 'vitest';
import { elementAt } from './checked.js';
import { evaluateMaskOnMeasured, interpolate } from './measured.js';

const wl = [400, 500, 600, 700];
const mask = {
  bands: [
    { from_nm: 450, to_nm: 650, quantity: 'R' as const, max_percent: 1, step_nm: 10, label: 'visible' },
    { from_nm: 500, to_nm: 500, quantity: 'R' as const, angles_deg: [45], max_percent: 2 },
  ],
};

describe('measured spectrum against a mask', () => {
  it('interpolates linearly between measured points', () => {
    expect(interpolate(wl, [0, 1, 2, 3], 450)).toBe(0.5);
    expect(interpolate(wl, [0, 1, 2, 3], 700)).toBe(3);
    expect(interpolate(wl, [0, 1, 2, 3], 399)).toBeNull();
  });

  it('finds the worst margin and where it is; a band at another angle is not evaluated, not passed', () => {
    // R rises linearly 0.2 % → 1.4 % over 400–700 nm: over 450–650 the worst is at 650 nm, 1.2 %.
    const r = evaluateMaskOnMeasured(mask, {
      quantity: 'R',
      angleDeg: 8,
      wavelengthsNm: wl,
      valuesPercent: [0.2, 0.6, 1.0, 1.4],
    });
    expect(r.bands[0]).toMatchObject({ evaluated: true, pass: false, label: 'visible' });
    const visible = elementAt(r.bands, 0, 'bands');
    expect(visible.worstMargin).toBeCloseTo(-0.2, 12);
    expect(visible.worstAt?.wavelengthNm).toBe(650);
    expect(r.bands[1]).toMatchObject({ evaluated: false, reason: 'measured at 8°; the band asks for 45°' });
    expect(r.pass).toBe(false);
    expect(r.worstMargin).toBeCloseTo(-0.2, 12);
    expect(r.worstBand).toBe(0);
  });

  it('passes only when every band was evaluated and met; otherwise says it cannot tell', () => {
    const low = {
      quantity: 'R' as const,
      angleDeg: 0,
      wavelengthsNm: wl,
      valuesPercent: [0.2, 0.3, 0.3, 0.2],
    };
    expect(evaluateMaskOnMeasured({ bands: [elementAt(mask.bands, 0, 'mask bands')] }, low).pass).toBe(true);
    expect(evaluateMaskOnMeasured(mask, low).pass).toBeNull();
    const t = evaluateMaskOnMeasured(mask, { ...low, quantity: 'T' });
    expect(elementAt(t.bands, 0, 'bands').reason).toBe('the band limits R; T was measured');
    expect(t.pass).toBeNull();
    expect(t.worstBand).toBeNull();
  });
});
