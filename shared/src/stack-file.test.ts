import { describe, expect, it } from 'vitest';
import { elementAt } from './checked.js';
import type { DesignVersionContent, NamedModel } from './designs.js';
import { designStackDescription } from './designs.js';
import { calculateSpectrum, responseAt } from './optics/batch.js';
import { constantIndex } from './optics/dispersion.js';
import { parseStack } from './optics/stack.js';
import { DESIGN_LIMITS } from './schemas/designs.js';
import { designStackFile, draftFromStackFile, type LibraryEntry } from './stack-file.js';

const SIO2 = { model: 'cauchy', A: 1.458, B: 0.00354, C: 0 } as const;
const LIBRARY: LibraryEntry[] = [
  { id: 1, name: 'Air', model: constantIndex(1) },
  { id: 2, name: 'Glass 1.52', model: constantIndex(1.52) },
  { id: 3, name: 'MgF2 film', model: constantIndex(1.38) },
  { id: 4, name: 'SiO2', model: SIO2 },
  { id: 5, name: 'TiO2 film', model: constantIndex(2.35, 0.0005) },
  { id: 6, name: 'Old ZnS', model: constantIndex(2.3), retired: true },
];
const MODELS = new Map<number, NamedModel>(LIBRARY.map((m) => [m.id, { name: m.name, model: m.model }]));
const CONTENT: DesignVersionContent = {
  incidentMaterialId: 1,
  substrateMaterialId: 2,
  substrateThicknessMm: 2,
  backSurface: 'front-only',
  referenceWavelengthNm: 550,
  notes: 'kept',
  layers: [
    { materialId: 3, thicknessNm: 99.637681, locked: false, notes: 'outer' },
    { materialId: 5, thicknessNm: 117.02, locked: false, notes: '' },
    { materialId: 4, thicknessNm: 30.5, locked: false, notes: '' },
  ],
};
const FALLBACK = {
  backSurface: 'front-only',
  substrateThicknessMm: 1,
  referenceWavelengthNm: 500,
  notes: 'kept',
} as const;

describe('stack files', () => {
  it('a quarter-wave MgF2 layer on glass written as a stack file gives the handbook reflectance', () => {
    // Single quarter-wave layer at normal incidence: R = ((n0·ns − n1²)/(n0·ns + n1²))²
    // (H. A. Macleod, Thin-Film Optical Filters, 4th ed., §3.2.1); n1 = 1.38, ns = 1.52 → 1.26 %.
    const quarter: DesignVersionContent = {
      ...CONTENT,
      layers: [{ materialId: 3, thicknessNm: 550 / 4 / 1.38, locked: false, notes: '' }],
    };
    const file = designStackFile(quarter, MODELS, { name: 'AR 1' });
    const R = responseAt(parseStack(JSON.parse(JSON.stringify(file))), 550, 0, 's').R;
    const expected = ((1.52 - 1.38 ** 2) / (1.52 + 1.38 ** 2)) ** 2;
    expect(R).toBeCloseTo(expected, 14);
    expect(expected).toBeCloseTo(0.012601, 6);
  });

  it('names the library materials, computes what the workspace computes and reads back as the same draft', () => {
    const both: DesignVersionContent = { ...CONTENT, backSurface: 'same-coating' };
    const file = designStackFile(both, MODELS, { name: 'Window AR', description: 'v3' });
    expect(Object.keys(file.materials ?? {})).toEqual([
      'MgF2 film',
      'TiO2 film',
      'SiO2',
      'Air',
      'Glass 1.52',
    ]);
    expect(file.layers[0]).toEqual({ material: 'MgF2 film', thickness_nm: 99.637681, label: 'outer' });
    const grid = { wavelengthsNm: [420, 550, 700], anglesDeg: [0, 30], polarisations: ['avg' as const] };
    const fromFile = calculateSpectrum(parseStack(JSON.parse(JSON.stringify(file))), grid, {
      back: 'incoherent',
    });
    const fromDesign = calculateSpectrum(parseStack(designStackDescription(both, MODELS)), grid, {
      back: 'incoherent',
    });
    expect([...fromFile.R]).toEqual([...fromDesign.R]);

    const back = draftFromStackFile(JSON.parse(JSON.stringify(file)), LIBRARY, FALLBACK);
    expect(back).toEqual({ ok: true, content: both });
  });

  it('converts QWOT layers, matches names case-insensitively, takes air for a missing incident medium', () => {
    const r = draftFromStackFile(
      {
        reference_nm: 600,
        substrate: { material: 'glass 1.52' },
        layers: [
          { material: 'mgf2 FILM', qwot: 1 },
          { material: 'SiO2', thickness_nm: 12 },
        ],
      },
      LIBRARY,
      FALLBACK,
    );
    if (!r.ok) throw new Error(r.problems.join('; '));
    expect(r.content.incidentMaterialId).toBe(1);
    expect(r.content.layers.map((l) => l.materialId)).toEqual([3, 4]);
    // A QWOT of 1 at 600 nm is a quarter wave: d = λ/(4n) = 600/(4·1.38) nm.
    expect(elementAt(r.content.layers, 0, 'layers').thicknessNm).toBeCloseTo(600 / (4 * 1.38), 12);
    expect(r.content).toMatchObject({
      referenceWavelengthNm: 600,
      substrateThicknessMm: 1,
      backSurface: 'front-only',
    });
  });

  it('reports every layer it cannot match, and the engine field for an invalid file', () => {
    const r = draftFromStackFile(
      {
        substrate: { material: 'Glass 1.52' },
        materials: { Unobtainium: { model: 'constant', n: 1.9 } },
        layers: [
          { material: 'Unobtainium', thickness_nm: 50 },
          { n: 2.1, thickness_nm: 20 },
          { material: 'Old ZnS', thickness_nm: 5 },
        ],
      },
      LIBRARY,
      FALLBACK,
    );
    expect(r).toEqual({
      ok: false,
      problems: [
        'layers[0]: material "Unobtainium" is not in the library (match a library name, or add it first)',
        'layers[1]: give a material by name; an index or model written inline has no library material',
        'layers[2]: material "Old ZnS" is retired in the library',
      ],
    });
    const odd = draftFromStackFile(
      {
        substrate: { material: 'Glass 1.52' },
        layers: [
          { material: 'SiO2', thickness_nm: 0 },
          { material: 'SiO2', thickness_nm: 2e6 },
        ],
        back_layers: [{ material: 'SiO2', thickness_nm: 10 }],
      },
      LIBRARY,
      FALLBACK,
    );
    expect(odd).toEqual({
      ok: false,
      problems: [
        'layers[0]: Thickness must be greater than 0 nm',
        `layers[1]: Thickness must be at most ${DESIGN_LIMITS.maxThicknessNm} nm`,
        'back_layers: only the front coating reversed (the same coating on both sides) can be imported',
      ],
    });
    const invalid = draftFromStackFile(
      { substrate: { material: 'SiO2' }, layers: [{ material: 'SiO2', thickness_nm: -3 }] },
      LIBRARY,
      FALLBACK,
    );
    expect(invalid.ok).toBe(false);
    expect(!invalid.ok && invalid.problems[0]).toMatch(/^layers\[0\]\.thickness_nm/);
  });
});
