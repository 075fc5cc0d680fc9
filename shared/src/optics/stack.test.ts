import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { OpticsInputError } from './errors.js';
import { MATERIAL_LIBRARY } from './library.js';
import { parseStack, stackThicknessNm, validateOpticalStack } from './stack.js';

const example = {
  incident: { n: 1.0 },
  substrate: { n: 1.52, k: 0 },
  layers: [
    { n: 2.35, k: 0.0001, thickness_nm: 50 },
    { n: 1.46, k: 0, thickness_nm: 93.2 },
  ],
};

describe('parseStack', () => {
  it('reads the documented stack file form', () => {
    const stack = parseStack(example);
    expect(stack.incident).toEqual({ model: 'constant', n: 1, k: 0 });
    expect(stack.substrate).toEqual({ model: 'constant', n: 1.52, k: 0 });
    expect(stack.layers.map((l) => l.thicknessNm)).toEqual([50, 93.2]);
    expect(elementAt(stack.layers, 0, 'layers').material).toEqual({ model: 'constant', n: 2.35, k: 0.0001 });
    expect(stack.exit).toEqual(stack.incident);
    expect(stack.backLayers).toEqual([]);
    expect(stackThicknessNm(stack)).toBeCloseTo(143.2, 12);
  });

  it('defaults the incident medium to air and resolves named materials', () => {
    const stack = parseStack({
      substrate: { material: 'N-BK7', thickness_mm: 2 },
      materials: { H: { model: 'cauchy', A: 2.2, B: 0.02 } },
      layers: [
        { material: 'H', thickness_nm: 20, label: 'H1' },
        { material: 'fused-silica', thickness_nm: 90 },
      ],
      back_layers: [{ n: 1.38, thickness_nm: 99.6 }],
    });
    expect(stack.incident).toEqual({ model: 'constant', n: 1, k: 0 });
    expect(stack.substrate).toBe(MATERIAL_LIBRARY['N-BK7']);
    expect(stack.substrateThicknessMm).toBe(2);
    expect(stack.layers[0]).toEqual({
      material: { model: 'cauchy', A: 2.2, B: 0.02, C: 0, k: 0 },
      thicknessNm: 20,
      label: 'H1',
    });
    expect(elementAt(stack.backLayers, 0, 'back layers').thicknessNm).toBe(99.6);
  });

  it('converts QWOT to physical thickness at the reference wavelength (d = QWOT·λ0/4n)', () => {
    const stack = parseStack({
      substrate: { n: 1.52 },
      reference_nm: 550,
      layers: [
        { n: 1.38, qwot: 1 },
        { n: 2.0, qwot: 2, reference_nm: 600 },
      ],
    });
    expect(elementAt(stack.layers, 0, 'layers').thicknessNm).toBeCloseTo(550 / (4 * 1.38), 12);
    expect(elementAt(stack.layers, 1, 'layers').thicknessNm).toBeCloseTo((2 * 600) / (4 * 2.0), 12);
  });

  const bad: [unknown, string, RegExp][] = [
    [{ ...example, layers: [{ n: 2.35, thickness_nm: -5 }] }, 'layers[0].thickness_nm', /must be 0 or more/],
    [
      { ...example, layers: [{ n: 2.35, thickness_nm: '50' }] },
      'layers[0].thickness_nm',
      /finite number \(got "50"\)/,
    ],
    [{ ...example, layers: [{ n: 2.35 }] }, 'layers[0]', /needs a thickness/],
    [{ ...example, layers: [{ k: 0.1, thickness_nm: 5 }] }, 'layers[0]', /give the index as "n"/],
    [
      { ...example, layers: [{ n: 1.4, thickness_nm: 5, qwot: 1 }] },
      'layers[0]',
      /either "thickness_nm" or "qwot"/,
    ],
    [{ ...example, layers: [{ n: 1.4, qwot: 1 }] }, 'layers[0].qwot', /needs a reference wavelength/],
    [
      { ...example, layers: [example.layers[0], { n: -1.46, thickness_nm: 9 }] },
      'layers[1].n',
      /greater than 0/,
    ],
    [{ ...example, layers: [{ n: 1.46, k: -0.1, thickness_nm: 9 }] }, 'layers[0].k', /0 or more/],
    [{ ...example, layers: [{ n: 1.46, thickness: 9 }] }, 'layers[0].thickness', /not a known field/],
    [
      { ...example, layers: [{ material: 'unobtainium', thickness_nm: 9 }] },
      'layers[0].material',
      /unknown material/,
    ],
    [{ ...example, substrate: undefined }, 'substrate', /is required/],
    [{ ...example, substrate: { n: 1.52, thickness_mm: 0 } }, 'substrate.thickness_mm', /greater than 0/],
    [{ ...example, incident: { n: 1.33, k: 0.01 } }, 'incident', /must be lossless/],
    [{ ...example, layers: undefined }, 'layers', /is required/],
    [{ ...example, layers: {} }, 'layers', /must be a list/],
    [[1, 2], '', /must be an object/],
  ];
  it.each(bad)('rejects %j naming %s', (input, field, message) => {
    let error: unknown;
    try {
      parseStack(input);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(OpticsInputError);
    expect((error as OpticsInputError).field).toBe(field);
    expect((error as OpticsInputError).message).toMatch(message);
  });
});

describe('validateOpticalStack', () => {
  it('checks stacks built in code with their own field names', () => {
    const stack = parseStack(example);
    expect(validateOpticalStack(stack)).toEqual(stack);
    expect(() =>
      validateOpticalStack({
        ...stack,
        layers: [{ ...elementAt(stack.layers, 0, 'layers'), thicknessNm: Number.NaN }],
      }),
    ).toThrow(/^layers\[0\]\.thicknessNm: must be a finite number/);
  });
});
