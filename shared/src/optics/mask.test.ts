import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { calculateSpectrum } from './batch.js';
import { constantIndex as c } from './dispersion.js';
import { OpticsInputError } from './errors.js';
import {
  bandWavelengthsNm,
  evaluateMask,
  evaluateMaskOnSpectrum,
  maskGrid,
  validateSpecMask,
  type SpecMask,
} from './mask.js';
import type { OpticalStack } from './stack.js';

// Bare glass of constant index: R = ((1 − 1.52)/(1 + 1.52))² = 4.2580 % everywhere (Hecht ch. 4).
const glass: OpticalStack = { incident: c(1), layers: [], substrate: c(1.52), backLayers: [], exit: c(1) };
const R_GLASS = 100 * (0.52 / 2.52) ** 2;

describe('evaluating a mask', () => {
  it('gives pass/fail, signed margins in percentage points and the merit', () => {
    const mask: SpecMask = {
      bands: [
        { from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 4, step_nm: 50 },
        { from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 5, step_nm: 100 },
        {
          from_nm: 500,
          to_nm: 600,
          quantity: 'R',
          target_percent: 3.95,
          tolerance_percent: 0.4,
          step_nm: 10,
        },
        { from_nm: 450, to_nm: 650, quantity: 'T', min_percent: 95, label: 'transmission' },
      ],
    };
    const res = evaluateMask(mask, glass);
    expect(res.bands.map((b) => b.pass)).toEqual([false, true, true, true]);
    const band = (i: number) => elementAt(res.bands, i, 'band results');
    expect(band(0).worstMargin).toBeCloseTo(4 - R_GLASS, 12);
    expect(band(1).worstMargin).toBeCloseTo(5 - R_GLASS, 12);
    expect(band(2).worstMargin).toBeCloseTo(0.4 - (R_GLASS - 3.95), 12);
    expect(band(3).worstMargin).toBeCloseTo(100 - R_GLASS - 95, 12);
    expect(res.bands.map((b) => b.samples)).toEqual([7, 4, 11, 201]);
    expect(band(3).label).toBe('transmission');
    expect(res.pass).toBe(false);
    expect(res.worstBand).toBe(0);
    expect(res.worstMargin).toBeCloseTo(4 - R_GLASS, 12);
    // Merit: weighted RMS of violations (limits) and deviations (targets), percentage points.
    const squares = 7 * (R_GLASS - 4) ** 2 + 11 * (R_GLASS - 3.95) ** 2;
    expect(res.merit).toBeCloseTo(Math.sqrt(squares / (7 + 4 + 11 + 201)), 12);
  });

  it('finds where the worst margin occurs', () => {
    const ar: OpticalStack = { ...glass, layers: [{ material: c(1.38), thicknessNm: 550 / (4 * 1.38) }] };
    const mask: SpecMask = {
      bands: [
        { from_nm: 420, to_nm: 680, angles_deg: [0, 30], quantity: 'R', max_percent: 1.5, polarisation: 's' },
      ],
    };
    const res = evaluateMask(mask, ar);
    const scan = calculateSpectrum(ar, {
      wavelengthsNm: bandWavelengthsNm(elementAt(mask.bands, 0, 'mask bands')),
      anglesDeg: [0, 30],
      polarisations: ['s'],
    });
    const maxR = Math.max(...scan.R);
    const at = scan.R.indexOf(maxR);
    expect(res.worstMargin).toBeCloseTo(1.5 - 100 * maxR, 12);
    expect(res.worstAt.angleDeg).toBe(at >= 261 ? 30 : 0);
    expect(res.worstAt.wavelengthNm).toBe(420 + (at % 261));
    expect(res.worstAt.valuePercent).toBeCloseTo(100 * maxR, 12);
    expect(res.merit).toBeGreaterThan(0);
  });

  it('evaluates on a spectrum computed elsewhere on the mask’s grid', () => {
    const mask: SpecMask = {
      bands: [{ from_nm: 500, to_nm: 510.5, quantity: 'R', max_percent: 5, step_nm: 2 }],
    };
    expect(bandWavelengthsNm(elementAt(mask.bands, 0, 'mask bands'))).toEqual([
      500, 502, 504, 506, 508, 510, 510.5,
    ]);
    const grid = maskGrid(mask);
    const spectrum = calculateSpectrum(glass, grid);
    expect(evaluateMaskOnSpectrum(mask, spectrum.plan, spectrum).pass).toBe(true);
    const other = calculateSpectrum(glass, { wavelengthsNm: [500], anglesDeg: [0], polarisations: ['avg'] });
    expect(() => evaluateMaskOnSpectrum(mask, other.plan, other)).toThrow(/502 nm was not computed/);
  });
});

describe('mask validation', () => {
  const band = { from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 1 };
  const bad: [unknown, string, RegExp][] = [
    [{ bands: [{ ...band, from_nm: 800 }] }, 'bands[0].from_nm', /must not exceed to_nm/],
    [{ bands: [{ ...band, max_percent: Number.NaN }] }, 'bands[0].max_percent', /finite number/],
    [{ bands: [{ ...band, max_percent: 120 }] }, 'bands[0].max_percent', /between 0 and 100/],
    [{ bands: [{ ...band, min_percent: 0.5 }] }, 'bands[0]', /only one bound/],
    [{ bands: [{ from_nm: 400, to_nm: 500, quantity: 'R' }] }, 'bands[0]', /needs a bound/],
    [
      { bands: [{ ...band, max_percent: undefined, target_percent: 2 }] },
      'bands[0].tolerance_percent',
      /required/,
    ],
    [{ bands: [{ ...band, quantity: 'A' }] }, 'bands[0].quantity', /one of "R", "T"/],
    [{ bands: [{ ...band, angles_deg: [0, 95] }] }, 'bands[0].angles_deg[1]', /below 90/],
    [{ bands: [{ ...band, step_nm: 0 }] }, 'bands[0].step_nm', /greater than 0/],
    [{ bands: [] }, 'bands', /at least one/],
    [
      { bands: [band, { ...band, from_nm: 650, to_nm: 750, max_percent: undefined, min_percent: 2 }] },
      'bands[1]',
      /contradicts bands\[0\] \(R ≤ 1 %\) over 650–700 nm at 0°, avg/,
    ],
    [
      { bands: [band, { ...band, max_percent: undefined, target_percent: 3, tolerance_percent: 0.5 }] },
      'bands[1]',
      /contradicts bands\[0\]/,
    ],
    [
      {
        bands: [
          { ...band, max_percent: undefined, min_percent: 60 },
          { ...band, quantity: 'T', max_percent: undefined, min_percent: 60 },
        ],
      },
      'bands[1]',
      /R \+ T cannot exceed 100 %/,
    ],
  ];
  it.each(bad)('rejects %j naming %s', (input, field, message) => {
    let error: unknown;
    try {
      validateSpecMask(input);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(OpticsInputError);
    expect((error as OpticsInputError).field).toBe(field);
    expect((error as OpticsInputError).message).toMatch(message);
  });

  it('accepts overlapping bands that agree, or that differ in angle or polarisation', () => {
    expect(() =>
      validateSpecMask({
        bands: [
          band,
          { ...band, max_percent: 2 },
          { ...band, angles_deg: [45], max_percent: undefined, min_percent: 5 },
        ],
      }),
    ).not.toThrow();
    expect(() =>
      validateSpecMask({
        bands: [band, { ...band, polarisation: 's', max_percent: undefined, min_percent: 5 }],
      }),
    ).not.toThrow();
  });
});
