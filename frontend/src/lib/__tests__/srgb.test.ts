import { describe, expect, it } from 'vitest';
import { D65_WHITE, encodeSrgb, labToXyz, swatchHex, xyzToHex, xyzToLinearSrgb } from '../srgb';

// IEC 61966-2-1:1999 (sRGB): the primaries' XYZ (D65, Y = 1 for white) are the columns of the
// RGB→XYZ matrix — red 0.4124, 0.2126, 0.0193; green 0.3576, 0.7152, 0.1192; blue 0.1805,
// 0.0722, 0.9505 — and the transfer function is 12.92·c below 0.0031308, else 1.055·c^(1/2.4) − 0.055.
// CIELAB: ISO/CIE 11664-4; D65 white X, Y, Z = 95.047, 100, 108.883 (CIE 015:2018).

describe('sRGB swatches', () => {
  it('maps the D65 white point to white and the primaries to themselves', () => {
    expect(xyzToHex(D65_WHITE)).toBe('#ffffff');
    expect(xyzToHex({ X: 41.24, Y: 21.26, Z: 1.93 })).toBe('#ff0000');
    expect(xyzToHex({ X: 35.76, Y: 71.52, Z: 11.92 })).toBe('#00ff00');
    expect(xyzToHex({ X: 18.05, Y: 7.22, Z: 95.05 })).toBe('#0000ff');
    const [r, g, b] = xyzToLinearSrgb(D65_WHITE);
    expect(r).toBeCloseTo(1, 3);
    expect(g).toBeCloseTo(1, 3);
    expect(b).toBeCloseTo(1, 3);
  });

  it('applies the sRGB transfer function on both sides of its knee', () => {
    expect(encodeSrgb(0.002)).toBeCloseTo(12.92 * 0.002, 12);
    // 1.055·0.5^(1/2.4) − 0.055 = 0.735357
    expect(encodeSrgb(0.5)).toBeCloseTo(0.735357, 6);
    expect(encodeSrgb(1.5)).toBeCloseTo(1, 12);
    expect(encodeSrgb(-0.2)).toBe(0);
  });

  it('brightens a dark reflection to full brightness, keeping its hue', () => {
    // A grey of 0.5 % luminance has the white point's chromaticity: the swatch is white.
    expect(swatchHex({ X: 0.475235, Y: 0.5, Z: 0.544415 })).toBe('#ffffff');
    // A dark red reflection stays red.
    expect(swatchHex({ X: 0.4124, Y: 0.2126, Z: 0.0193 })).toBe('#ff0000');
    expect(swatchHex({ X: 0, Y: 0, Z: 0 })).toBe('#000000');
  });

  it('inverts CIELAB back to XYZ', () => {
    const white = labToXyz(100, 0, 0);
    expect(white.X).toBeCloseTo(95.047, 9);
    expect(white.Y).toBeCloseTo(100, 9);
    expect(white.Z).toBeCloseTo(108.883, 9);
    // L* = 50 is Y = 100·((50 + 16)/116)³ = 18.4187 (ISO/CIE 11664-4).
    expect(labToXyz(50, 0, 0).Y).toBeCloseTo(18.4187, 4);
    // Below the knee (L* ≤ 8): Y = 100·L*/903.3 (κ = 24389/27).
    expect(labToXyz(4, 0, 0).Y).toBeCloseTo((100 * 4 * 27) / 24389, 9);
  });
});
