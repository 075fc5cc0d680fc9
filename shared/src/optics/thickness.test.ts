import { describe, expect, it } from 'vitest';
import { required } from '../checked.js';
import { responseAt } from './batch.js';
import { constantIndex as c } from './dispersion.js';
import { MATERIAL_LIBRARY } from './library.js';
import { materialNmToQwot, materialQwotToNm, nmToQwot, qwotToNm } from './thickness.js';

describe('QWOT ⇄ nm (Macleod ch. 2: one QWOT is n·d = λ0/4)', () => {
  it('converts both ways', () => {
    expect(qwotToNm(1, 1.38, 550)).toBeCloseTo(550 / (4 * 1.38), 13);
    expect(qwotToNm(2, 2.0, 600)).toBeCloseTo(150, 13);
    expect(nmToQwot(150, 2.0, 600)).toBeCloseTo(2, 14);
    for (const q of [0, 0.37, 1, 2.5]) expect(nmToQwot(qwotToNm(q, 1.7, 510), 1.7, 510)).toBeCloseTo(q, 14);
  });

  it('one QWOT is a quarter wave: phase π/2, the quarter-wave reflectance', () => {
    // Quarter-wave on 1.52: R = ((1.52 − n²)/(1.52 + n²))² (Macleod ch. 2).
    const d = qwotToNm(1, 1.38, 550);
    const stack = {
      incident: c(1),
      layers: [{ material: c(1.38), thicknessNm: d }],
      substrate: c(1.52),
      backLayers: [],
      exit: c(1),
    };
    expect(responseAt(stack, 550, 0, 's').R).toBeCloseTo(((1.52 - 1.38 ** 2) / (1.52 + 1.38 ** 2)) ** 2, 14);
  });

  it('uses the material’s index at the reference wavelength', () => {
    const silica = required(MATERIAL_LIBRARY['fused-silica'], 'library material fused-silica');
    // n(632.8 nm) = 1.45702 (Malitson 1965).
    expect(materialQwotToNm(silica, 1, 632.8)).toBeCloseTo(632.8 / (4 * 1.45702), 3);
    expect(materialNmToQwot(silica, materialQwotToNm(silica, 3, 632.8), 632.8)).toBeCloseTo(3, 13);
  });

  it('rejects bad input with the field named', () => {
    expect(() => qwotToNm(-1, 1.5, 550)).toThrow(/^qwot: must be 0 or more/);
    expect(() => qwotToNm(1, 0, 550)).toThrow(/^n: must be greater than 0/);
    expect(() => nmToQwot(Number.NaN, 1.5, 550)).toThrow(/^thickness_nm: must be a finite number/);
    expect(() => nmToQwot(10, 1.5, 0)).toThrow(/^reference_nm: must be greater than 0/);
  });
});
