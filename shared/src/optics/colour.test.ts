import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { seededRandom } from './__tests__/random.js';
import { calculateSpectrum } from './batch.js';
import {
  COLOUR_SAMPLES,
  chromaticity,
  colourMatching,
  colourWavelengthsNm,
  illuminantA,
  illuminantPower,
  luminousFraction,
  reflectedColour,
  spectrumColour,
  tristimulus,
  whitePoint,
  xyzToLab,
} from './colour.js';
import { constantIndex as c } from './dispersion.js';
import type { OpticalStack } from './stack.js';

describe('CIE data', () => {
  it('has the published colour-matching checkpoints', () => {
    // CIE 1931 2° observer peaks as published in the CIE table that Debian's colord-data 1.4.6
    // ships (/usr/share/colord/cmf/CIE1931-2deg-XYZ.cmf): ȳ(555) = 1.0, x̄(600) = 1.0622,
    // z̄(445) = 1.7826; x̄(600) = 1.0622 also in python3-colormath 3.0.0 (spectral_constants.py,
    // STDOBSERV_X2, 10 nm table).
    expect(colourMatching(555)[1]).toBe(1);
    expect(colourMatching(600)[0]).toBe(1.0622);
    expect(colourMatching(445)[2]).toBe(1.7826);
  });

  it('gives the D65 white point X = 95.047, Y = 100, Z = 108.883 within 0.01', () => {
    // CIE 015:2018 (from 1 nm data; the 5 nm table over 380–780 nm lands within 0.005).
    const w = whitePoint(new Float64Array(3), 'D65');
    expect(Math.abs(elementAt(w, 0, 'white point') - 95.047)).toBeLessThan(0.01);
    expect(w[1]).toBeCloseTo(100, 12);
    expect(Math.abs(elementAt(w, 2, 'white point') - 108.883)).toBeLessThan(0.01);
    // D65 chromaticity from the published 2° white point X, Y, Z = 0.95047, 1, 1.08883
    // (python3-colormath 3.0.0, color_constants.py, ILLUMINANTS['2']['d65']):
    // x = 0.95047 / 3.0393 = 0.31272, y = 1 / 3.0393 = 0.32903.
    const xy = chromaticity(new Float64Array(2), w);
    expect(xy[0]).toBeCloseTo(0.31272, 4);
    expect(xy[1]).toBeCloseTo(0.32903, 4);
  });

  it('computes illuminant A from its CIE formula, matching the CIE table', () => {
    // CIE illuminant A table values, read from the CIE 1 nm table as shipped in Debian's colord-data
    // 1.4.6 (/usr/share/colord/illuminant/CIE-A.sp, there scaled to 1 at 560 nm).
    const table: [number, number][] = [
      [300, 0.930483],
      [380, 9.7951],
      [460, 37.8121],
      [560, 100],
      [700, 198.261],
      [780, 241.675],
      [830, 261.602],
    ];
    for (const [wl, value] of table) expect(Math.abs(illuminantA(wl) / value - 1)).toBeLessThan(1e-5);
    // White point of A, 2°: X, Y, Z = 1.09850, 1, 0.35585 (python3-colormath 3.0.0,
    // color_constants.py, ILLUMINANTS['2']['a']), so x = 1.0985 / 2.45435 = 0.44757,
    // y = 1 / 2.45435 = 0.40744.
    const wA = whitePoint(new Float64Array(3), 'A');
    expect(Math.abs(elementAt(wA, 0, 'white point') - 109.85)).toBeLessThan(0.01);
    expect(wA[1]).toBeCloseTo(100, 12);
    expect(Math.abs(elementAt(wA, 2, 'white point') - 35.585)).toBeLessThan(0.01);
    const xy = chromaticity(new Float64Array(2), wA);
    expect(xy[0]).toBeCloseTo(0.44757, 4);
    expect(xy[1]).toBeCloseTo(0.40744, 4);
  });

  it('rejects wavelengths off the tables', () => {
    expect(() => colourMatching(552)).toThrow(/5 nm steps/);
    expect(() => illuminantPower('D65', 900)).toThrow(/300–830 nm/);
  });
});

describe('colour of a spectrum', () => {
  it('a spectrally flat reflector is neutral: a* = b* = 0, Rv = R, L* from the CIE formula', () => {
    // CIE 015:2018: a flat reflector has the white point's chromaticity; L* = 116·R^(1/3) − 16 above (6/29)³ and (29/3)³·R below (CIE 015:2018).
    for (const R of [0.005, 0.04, 0.3, 1]) {
      const col = spectrumColour(new Float64Array(COLOUR_SAMPLES).fill(R));
      expect(col.a).toBeCloseTo(0, 12);
      expect(col.b).toBeCloseTo(0, 12);
      expect(col.Rv).toBeCloseTo(R, 14);
      expect(col.L).toBeCloseTo(R > (6 / 29) ** 3 ? 116 * Math.cbrt(R) - 16 : (29 / 3) ** 3 * R, 10);
      expect(luminousFraction(new Float64Array(COLOUR_SAMPLES).fill(R), 'A')).toBeCloseTo(R, 14);
    }
  });

  it('converts XYZ to CIELAB like colorjs.io', () => {
    // colorjs.io 'lab-d65' uses the D65 white from its chromaticity (0.3127, 0.3290); give ours the same.
    const white = [0.3127 / 0.329, 1, (1 - 0.3127 - 0.329) / 0.329];
    const rand = seededRandom(5);
    for (let i = 0; i < 200; i++) {
      // Include very dark colours (the linear branch of f) as well as light ones.
      const scale = i % 2 === 0 ? 1 : 0.005;
      const xyz = [rand() * scale * 0.95, rand() * scale, rand() * scale * 1.09];
      const ours = xyzToLab(new Float64Array(3), xyz, white);
      const theirs = new Color('xyz-d65', xyz as [number, number, number]).to('lab-d65').coords;
      expect(ours[0]).toBeCloseTo(theirs[0] as number, 9);
      expect(ours[1]).toBeCloseTo(theirs[1] as number, 9);
      expect(ours[2]).toBeCloseTo(theirs[2] as number, 9);
    }
  });

  it('weights luminous reflectance by D65 and ȳ: a green-only reflector', () => {
    const spectrum = new Float64Array(COLOUR_SAMPLES);
    const wl = colourWavelengthsNm();
    let num = 0;
    let den = 0;
    for (let i = 0; i < COLOUR_SAMPLES; i++) {
      const lambda = elementAt(wl, i, 'colour wavelengths');
      const r = lambda >= 500 && lambda <= 600 ? 1 : 0;
      spectrum[i] = r;
      const w = illuminantPower('D65', lambda) * colourMatching(lambda)[1];
      num += r * w;
      den += w;
    }
    // Rv = Σ R S ȳ / Σ S ȳ (the luminous reflectance of ISO 13666, with CIE 015:2018 tables).
    expect(luminousFraction(spectrum)).toBeCloseTo(num / den, 14);
    const col = spectrumColour(spectrum);
    expect(col.a).toBeLessThan(-10); // green
    expect(tristimulus(new Float64Array(3), spectrum)[1]).toBeCloseTo(100 * (num / den), 12);
  });
});

describe('reflected colour of a stack', () => {
  const glass: OpticalStack = { incident: c(1), layers: [], substrate: c(1.52), backLayers: [], exit: c(1) };

  it('bare glass of constant index is neutral with Rv = its Fresnel R', () => {
    const col = reflectedColour(glass);
    expect(col.Rv).toBeCloseTo(0.04258, 6);
    expect(col.a).toBeCloseTo(0, 10);
    expect(col.b).toBeCloseTo(0, 10);
  });

  it('matches the colour of the computed spectrum at an angle', () => {
    const ar: OpticalStack = { ...glass, layers: [{ material: c(1.38), thicknessNm: 99.6 }] };
    const col = reflectedColour(ar, { angleDeg: 45, polarisation: 'avg' });
    const spectrum = calculateSpectrum(ar, {
      wavelengthsNm: colourWavelengthsNm(),
      anglesDeg: [45],
      polarisations: ['avg'],
    });
    expect(col).toEqual(spectrumColour(spectrum.R));
    // A single MgF2-like quarter wave at 550 nm reflects more blue and red than green: not neutral.
    expect(Math.hypot(col.a, col.b)).toBeGreaterThan(1);
  });

  it('validates its options', () => {
    expect(() => reflectedColour(glass, { angleDeg: 95 })).toThrow(/^angleDeg/);
    expect(() => reflectedColour(glass, { illuminant: 'F2' as never })).toThrow(/^illuminant/);
  });
});
