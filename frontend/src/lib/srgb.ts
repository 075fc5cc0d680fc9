/*
 * CIE XYZ ↔ sRGB for colour swatches. Matrix and transfer function of IEC 61966-2-1:1999 (sRGB),
 * D65 reference white; CIELAB inverse of ISO/CIE 11664-4.
 */

/** Tristimulus values on the engine's scale (Y = 100 for a perfect reflector). */
export interface Tristimulus {
  X: number;
  Y: number;
  Z: number;
}

/** D65 white point, 2° observer, Y = 100 (CIE 015:2018). */
export const D65_WHITE: Tristimulus = { X: 95.047, Y: 100, Z: 108.883 };

/** Linear sRGB (0–1 inside the gamut) from XYZ with Y = 100 for white (IEC 61966-2-1 matrix). */
export function xyzToLinearSrgb({ X, Y, Z }: Tristimulus): [number, number, number] {
  const x = X / 100;
  const y = Y / 100;
  const z = Z / 100;
  return [
    3.2406 * x - 1.5372 * y - 0.4986 * z,
    -0.9689 * x + 1.8758 * y + 0.0415 * z,
    0.0557 * x - 0.204 * y + 1.057 * z,
  ];
}

/** The sRGB transfer function: linear 0–1 to the encoded 0–1 value. */
export function encodeSrgb(linear: number): number {
  const c = Math.min(1, Math.max(0, linear));
  return c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
}

function hexByte(encoded: number): string {
  return Math.round(encoded * 255)
    .toString(16)
    .padStart(2, '0');
}

/** `#rrggbb` of a colour, clipped to the sRGB gamut. */
export function xyzToHex(xyz: Tristimulus): string {
  return `#${xyzToLinearSrgb(xyz).map(encodeSrgb).map(hexByte).join('')}`;
}

/**
 * A swatch for a reflected colour: its hue and saturation brought up to full brightness (the
 * brightest sRGB channel at 1). The light an AR coating reflects is a few tenths of a percent of
 * the incident light, far too dark to judge its hue at its real luminance.
 */
export function swatchHex(xyz: Tristimulus): string {
  const linear = xyzToLinearSrgb(xyz).map((c) => Math.max(0, c));
  const peak = Math.max(...linear);
  if (!(peak > 0)) return '#000000';
  return `#${linear
    .map((c) => encodeSrgb(c / peak))
    .map(hexByte)
    .join('')}`;
}

/** XYZ (Y = 100 scale) from CIELAB L*, a*, b* relative to `white` (ISO/CIE 11664-4 inverse). */
export function labToXyz(L: number, a: number, b: number, white: Tristimulus = D65_WHITE): Tristimulus {
  const delta = 6 / 29;
  const fy = (L + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const inv = (f: number) => (f > delta ? f ** 3 : 3 * delta * delta * (f - 4 / 29));
  return { X: white.X * inv(fx), Y: white.Y * inv(fy), Z: white.Z * inv(fz) };
}
