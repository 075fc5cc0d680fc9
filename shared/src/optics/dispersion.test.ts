import { describe, expect, it } from 'vitest';
import { elementAt, required } from '../checked.js';
import {
  countOutsideRange,
  evaluateIndex,
  indexAt,
  validateMaterialModel,
  type MaterialModel,
  type TabulatedIndex,
} from './dispersion.js';
import { OpticsInputError } from './errors.js';
import { MATERIAL_LIBRARY } from './library.js';

function samples(model: MaterialModel, wavelengths: number[]) {
  return evaluateIndex(
    { n: new Float64Array(wavelengths.length), k: new Float64Array(wavelengths.length) },
    model,
    wavelengths,
  );
}

describe('Sellmeier glasses from published coefficients', () => {
  it('N-BK7 (SCHOTT data sheet): nF, nd, nC and Abbe number', () => {
    // SCHOTT N-BK7 data sheet: n(486.13) = 1.52238, n(587.56) = 1.51680, n(656.27) = 1.51432, νd = 64.17.
    const glass = required(MATERIAL_LIBRARY['N-BK7'], 'library material N-BK7');
    const nF = indexAt(glass, 486.13).n;
    const nd = indexAt(glass, 587.56).n;
    const nC = indexAt(glass, 656.27).n;
    expect(nF).toBeCloseTo(1.52238, 5);
    expect(nd).toBeCloseTo(1.5168, 5);
    expect(nC).toBeCloseTo(1.51432, 5);
    expect((nd - 1) / (nF - nC)).toBeCloseTo(64.17, 2);
    expect(indexAt(glass, 587.56).k).toBe(0);
  });

  it('fused silica (Malitson, J. Opt. Soc. Am. 55, 1205 (1965))', () => {
    const silica = required(MATERIAL_LIBRARY['fused-silica'], 'library material fused-silica');
    expect(indexAt(silica, 587.56).n).toBeCloseTo(1.45846, 5);
    expect(indexAt(silica, 632.8).n).toBeCloseTo(1.45702, 5);
    expect(indexAt(silica, 1064).n).toBeCloseTo(1.44963, 5);
  });

  it('rejects a wavelength at a pole or where n² ≤ 0', () => {
    const model = validateMaterialModel({ model: 'sellmeier', B: [1], C: [0.25] });
    // Pole at λ = 500 nm (λ² = C); just below it n² = 1 + λ²/(λ² − C) < 0.
    expect(() => indexAt(model, 500)).toThrow(OpticsInputError);
    expect(() => indexAt(model, 490, 'layers[3]')).toThrow(/layers\[3\].*no physical index at 490 nm/);
    expect(indexAt(model, 510).n).toBeCloseTo(Math.sqrt(1 + 0.2601 / 0.0101), 12);
  });
});

describe('formula models and their valid range', () => {
  // N-BK7, SCHOTT optical glass data sheet: the Sellmeier coefficients are stated for 0.3–2.5 µm.
  const bk7 = { ...MATERIAL_LIBRARY['N-BK7'], validNm: { from: 300, to: 2500 } } as MaterialModel;

  it('refuses a wavelength outside the stated range instead of extrapolating', () => {
    const model = validateMaterialModel(bk7);
    expect(indexAt(model, 587.56).n).toBeCloseTo(1.5168, 5); // SCHOTT data sheet nd
    // Without a range the formula runs on to 12 µm and gives a meaningless n ≈ 2.4.
    expect(indexAt(required(MATERIAL_LIBRARY['N-BK7'], 'library material N-BK7'), 12_000).n).toBeGreaterThan(
      2,
    );
    expect(() => indexAt(model, 12_000, 'substrate')).toThrow(
      /substrate\.validNm: 12000 nm is outside the sellmeier model's valid range \(300–2500 nm\)/,
    );
    expect(() => indexAt(model, 250)).toThrow(OpticsInputError);
  });

  it('with clamp holds the end value and counts the held points', () => {
    const held = validateMaterialModel({ ...bk7, clamp: true });
    expect(indexAt(held, 12_000).n).toBe(indexAt(held, 2500).n);
    expect(indexAt(held, 250).n).toBe(indexAt(held, 300).n);
    expect(countOutsideRange(held, [250, 587.56, 2500, 12_000])).toBe(2);
    expect(countOutsideRange(required(MATERIAL_LIBRARY['N-BK7'], 'library material N-BK7'), [12_000])).toBe(
      0,
    );
  });

  it('applies to Cauchy models too and checks the range itself', () => {
    const cauchy = validateMaterialModel({
      model: 'cauchy',
      A: 1.45,
      B: 0.004,
      validNm: { from: 400, to: 800 },
    });
    expect(() => indexAt(cauchy, 900)).toThrow(/900 nm is outside the cauchy model's valid range/);
    expect(() =>
      validateMaterialModel({ model: 'cauchy', A: 1.45, validNm: { from: 800, to: 400 } }, 'm'),
    ).toThrow(/m\.validNm: from \(800 nm\) must be below to \(400 nm\)/);
    expect(() => validateMaterialModel({ model: 'sellmeier', B: [1], C: [0.01], clamp: true }, 'm')).toThrow(
      /m\.clamp: needs a validNm range/,
    );
  });
});

describe('Cauchy', () => {
  it('evaluates n = A + B/λ² + C/λ⁴ with λ in µm and the exponential k tail', () => {
    const model = validateMaterialModel({
      model: 'cauchy',
      A: 1.45,
      B: 0.0036,
      C: 0.0001,
      absorption: { k: 0.001, exponent: 1.5, reference: 400 },
    });
    const { n, k } = samples(model, [500, 400]);
    expect(n[0]).toBeCloseTo(1.45 + 0.0036 / 0.25 + 0.0001 / 0.0625, 14);
    expect(k[1]).toBeCloseTo(0.001, 15); // k at the reference wavelength
    expect(k[0]).toBeCloseTo(0.001 * Math.exp(1.5 * (1 / 0.5 - 1 / 0.4)), 15);
    expect(k[0]).toBeLessThan(elementAt(k, 1, 'k')); // positive exponent: absorption rises towards the UV
  });

  it('refuses both a constant k and an absorption tail', () => {
    expect(() =>
      validateMaterialModel({
        model: 'cauchy',
        A: 1.5,
        k: 0.1,
        absorption: { k: 0.1, exponent: 1, reference: 400 },
      }),
    ).toThrow(/either a constant k or an absorption tail/);
  });
});

describe('tables', () => {
  const table: TabulatedIndex = {
    model: 'table',
    wavelengths: [400, 500, 600, 700],
    n: [2.4, 2.3, 2.25, 2.22],
    k: [0.01, 0.002, 0, 0],
  };

  it('interpolates linearly between rows and hits the rows exactly', () => {
    const model = validateMaterialModel(table);
    const { n, k } = samples(model, [400, 450, 575, 700]);
    expect(n[0]).toBe(2.4);
    expect(n[1]).toBeCloseTo(2.35, 14);
    expect(n[2]).toBeCloseTo(2.2625, 14);
    expect(k[1]).toBeCloseTo(0.006, 15);
    expect(n[3]).toBe(2.22);
  });

  it('pchip (Fritsch–Carlson) passes through the rows and never overshoots', () => {
    const model = validateMaterialModel({ ...table, interpolation: 'pchip' });
    const grid = Array.from({ length: 301 }, (_, i) => 400 + i);
    const { n, k } = samples(model, grid);
    for (const [i, wl] of [400, 500, 600, 700].entries()) {
      expect(n[wl - 400]).toBeCloseTo(elementAt(table.n, i, 'table n'), 14);
    }
    for (let i = 1; i < grid.length; i++) {
      expect(n[i]).toBeLessThanOrEqual(elementAt(n, i - 1, 'n') + 1e-15); // monotone data stays monotone
      expect(k[i]).toBeGreaterThanOrEqual(0); // k never dips below zero between rows
    }
  });

  it('is an error outside the table unless clamping is asked for, and clamping is counted', () => {
    const model = validateMaterialModel(table);
    expect(() => samples(model, [380])).toThrow(/380 nm is outside the table \(400–700 nm\)/);
    const clamped = validateMaterialModel({ ...table, clamp: true });
    const { n } = samples(clamped, [380, 720]);
    expect(n[0]).toBe(2.4);
    expect(n[1]).toBe(2.22);
    expect(countOutsideRange(clamped, [380, 450, 720])).toBe(2);
  });

  it('checks rows: increasing wavelengths, matching lengths', () => {
    expect(() =>
      validateMaterialModel({ ...table, wavelengths: [400, 500, 500, 700] }, 'materials.H'),
    ).toThrow(/materials\.H\.wavelengths\[2\].*increase strictly/);
    expect(() => validateMaterialModel({ ...table, n: [2.4, 2.3] })).toThrow(
      /n: must have one value per wavelength/,
    );
  });
});

describe('parameter validation names the field', () => {
  const cases: [unknown, RegExp][] = [
    [{ model: 'constant', n: 0 }, /^x\.n: must be greater than 0/],
    [{ model: 'constant', n: 1.5, k: -0.1 }, /^x\.k: must be 0 or more/],
    [{ model: 'constant', n: Number.NaN }, /^x\.n: must be a finite number/],
    [{ model: 'sellmeier', B: [1, 2, 3, 4], C: [0, 0, 0, 0] }, /^x\.B: must have 1 to 3 terms/],
    [{ model: 'sellmeier', B: [1], C: [-1] }, /^x\.C\[0\]: must be 0 or more/],
    [{ model: 'cauchy', A: 'two' }, /^x\.A: must be a finite number \(got "two"\)/],
    [{ model: 'drude' }, /^x\.model: must be one of/],
    [{ model: 'constant', n: 1.5, colour: 'red' }, /^x\.colour: is not a known field/],
  ];
  it.each(cases)('%j', (input, message) => {
    expect(() => validateMaterialModel(input, 'x')).toThrow(message);
  });
});
