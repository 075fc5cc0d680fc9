import { describe, expect, it } from 'vitest';
import type { StackDescription } from '@quietglass/shared';
import { createPreviewCalculator, type PreviewRequest } from '../preview/compute-preview';

// Single quarter-wave layer n1 on a substrate ns from air at the reference wavelength
// (Macleod, Thin-Film Optical Filters, 5th ed., ch. 2):
// R = ((n0·ns − n1²)/(n0·ns + n1²))²; n1 = 1.38 (MgF2), ns = 1.52, n0 = 1: R = 0.012601.
// Quarter-wave physical thickness d = λ0/(4·n1) = 550/(4·1.38) = 99.6377 nm.
const QUARTER_WAVE_NM = 550 / (4 * 1.38);
const R_QUARTER_WAVE = ((1.52 - 1.38 ** 2) / (1.52 + 1.38 ** 2)) ** 2;

function stack(thicknessNm: number): StackDescription {
  return {
    incident: { n: 1 },
    substrate: { n: 1.52, thickness_mm: 1 },
    materials: { MgF2: { model: 'constant', n: 1.38, k: 0 } },
    layers: [{ material: 'MgF2', thickness_nm: thicknessNm }],
  };
}

function request(thicknessNm: number, maxPercent: number): PreviewRequest {
  return {
    slot: 'live',
    stack: stack(thicknessNm),
    back: 'none',
    // 400 + 300·150/300 = 550 nm is grid point 150.
    wavelengths: { fromNm: 400, toNm: 700, count: 301 },
    anglesDeg: [0],
    polarisation: 'avg',
    maskBands: [{ from_nm: 540, to_nm: 560, angles_deg: [0], quantity: 'R', max_percent: maxPercent }],
    colourAngleDeg: 0,
  };
}

describe('preview computation', () => {
  it('gives R = 1.26 % at 550 nm for a MgF2 quarter-wave on n = 1.52 (Macleod ch. 2)', () => {
    const result = createPreviewCalculator().compute(request(QUARTER_WAVE_NM, 1.5));

    expect(R_QUARTER_WAVE).toBeCloseTo(0.012601, 6);
    expect(result.wavelengthsNm[150]).toBeCloseTo(550, 9);
    expect(result.curves).toHaveLength(1);
    expect(result.curves[0]!.R[150]).toBeCloseTo(R_QUARTER_WAVE, 6);
    // Lossless: T = 1 − R (Hecht, Optics, ch. 4: R + T = 1 without absorption).
    expect(result.curves[0]!.T[150]).toBeCloseTo(1 - R_QUARTER_WAVE, 6);
    // The quarter-wave minimum lies at the reference wavelength: R rises either side.
    expect(result.curves[0]!.R[100]).toBeGreaterThan(result.curves[0]!.R[150]!);
    expect(result.curves[0]!.R[200]).toBeGreaterThan(result.curves[0]!.R[150]!);
  });

  it('passes a mask of R ≤ 1.5 % and fails R ≤ 1.0 %, naming the worst margin and where it is', () => {
    const calculator = createPreviewCalculator();

    const pass = calculator.compute(request(QUARTER_WAVE_NM, 1.5)).mask;
    // The largest R over 540–560 nm lies at an end of the band; 1.5 − R there is the worst margin.
    expect(pass?.pass).toBe(true);
    expect(pass?.worstMargin).toBeGreaterThan(0);
    expect(pass?.worstMargin).toBeLessThan(1.5 - 100 * R_QUARTER_WAVE);

    const fail = calculator.compute(request(QUARTER_WAVE_NM, 1.0)).mask;
    expect(fail?.pass).toBe(false);
    // At best 1.0 − 1.2601 = −0.2601 percentage points (at 550 nm); the band ends are worse still.
    expect(fail?.worstMargin).toBeLessThan(1.0 - 100 * R_QUARTER_WAVE + 1e-9);
    expect(fail?.worstAt.angleDeg).toBe(0);
    expect([540, 560]).toContain(fail?.worstAt.wavelengthNm);
  });

  it('reuses its plan when only a thickness changes and still follows the new thickness', () => {
    const calculator = createPreviewCalculator();
    calculator.compute(request(QUARTER_WAVE_NM, 1.5));
    // A half-wave layer is absentee (Macleod ch. 2): R at 550 nm equals the bare substrate's,
    // ((1 − 1.52)/(1 + 1.52))² = 0.042580 (Hecht, Optics, ch. 4).
    const halfWave = calculator.compute(request(2 * QUARTER_WAVE_NM, 1.5));
    expect(halfWave.curves[0]!.R[150]).toBeCloseTo(0.04258, 5);
    expect(halfWave.mask?.pass).toBe(false);
  });

  it('reports the colour of a spectrally flat reflector as neutral with Rv = R (CIE 015:2018)', () => {
    // A bare substrate reflects 4.258 % at every wavelength when its index does not disperse.
    const result = createPreviewCalculator().compute({
      ...request(QUARTER_WAVE_NM, 1.5),
      stack: { ...stack(1), layers: [] },
    });
    expect(result.colour?.Rv).toBeCloseTo(0.04258, 5);
    expect(result.colour?.a).toBeCloseTo(0, 6);
    expect(result.colour?.b).toBeCloseTo(0, 6);
  });

  it('throws a message naming the field for a stack the engine rejects', () => {
    expect(() =>
      createPreviewCalculator().compute({ ...request(QUARTER_WAVE_NM, 1.5), stack: stack(-5) }),
    ).toThrow(/layers\[0\]\.thickness_nm/);
  });
});
