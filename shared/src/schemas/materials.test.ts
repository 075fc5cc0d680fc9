import { describe, expect, it } from 'vitest';
import {
  importConstantsFileSchema,
  importMaterialCsvSchema,
  materialInputSchema,
  materialUpdateSchema,
} from './materials.js';
import { problems } from './__tests__/problems.js';

// Invented materials; the numbers only need to give a physical index.
const good = {
  name: ' Test oxide ',
  model: { model: 'constant', n: 1.5 },
  rangeNm: { from: 400, to: 900 },
  typical: true,
};

describe('material input schema', () => {
  it("trims the name, fills the engine's defaults and resolves the provenance", () => {
    expect(materialInputSchema.parse(good)).toEqual({
      name: 'Test oxide',
      model: { model: 'constant', n: 1.5, k: 0 },
      rangeNm: { from: 400, to: 900 },
      provenance: { kind: 'typical', source: '', run: '', date: null, notes: '' },
    });
  });

  it('gives a formula model the stated range as its valid range', () => {
    const parsed = materialInputSchema.parse({
      ...good,
      model: { model: 'cauchy', A: 1.45, B: 0.004, clamp: true },
    });
    expect(parsed.model).toMatchObject({ model: 'cauchy', validNm: { from: 400, to: 900 }, clamp: true });
  });

  it.each([
    [{ model: { model: 'constant', n: -1.5 } }, 'model.n: must be greater than 0 (got -1.5)'],
    [{ model: { model: 'constant', n: 1.5, k: -0.1 } }, 'model.k: must be 0 or more (got -0.1)'],
    [
      { model: { model: 'sellmeier', B: [1, 1, 1, 1], C: [0, 0, 0, 0] } },
      'model.B: must have 1 to 3 terms (got 4)',
    ],
    [
      { model: { model: 'table', wavelengths: [400, 500], n: [1.5, 1.4] }, rangeNm: { from: 380, to: 500 } },
      'rangeNm: the range 380–500 nm reaches beyond the table (400–500 nm)',
    ],
    [
      { model: { model: 'table', wavelengths: [400, 400, 500], n: [1.5, 1.4, 1.3] } },
      'model.wavelengths.1: wavelengths must increase strictly (400 nm follows 400 nm)',
    ],
    [{ rangeNm: { from: 900, to: 400 } }, 'rangeNm.to: To must be above From'],
    [{ rangeNm: { from: 0, to: 400 } }, 'rangeNm.from: From must be a wavelength greater than 0 nm'],
    [{ rangeNm: [400, 900] }, 'rangeNm: rangeNm must be an object { from, to }'],
    [{ model: 'constant' }, 'model: model must be a dispersion model object'],
    [{ name: '  ' }, 'name: Enter a name'],
    [{ typical: undefined }, 'provenance.kind: Say where the data come from'],
    [
      { typical: undefined, provenance: { kind: 'published', source: ' ' } },
      'provenance.source: A published material needs its reference',
    ],
    [
      { provenance: { kind: 'published', source: 'x' } },
      'typical: typical (true) contradicts provenance.kind "published"',
    ],
    [
      { typical: false, provenance: { kind: 'measured', date: '2026-11-31', run: 'B2-118' } },
      'provenance.date: A date as YYYY-MM-DD',
    ],
  ])('refuses %j: %s', (patch, line) => {
    expect(problems(materialInputSchema, { ...good, ...patch })).toEqual([line]);
  });

  it('names both what a measurement lacks', () => {
    expect(
      problems(materialInputSchema, { ...good, typical: undefined, provenance: { kind: 'measured' } }),
    ).toEqual([
      'provenance.date: A measurement needs its date',
      'provenance.run: A measurement needs its run',
    ]);
  });

  it('refuses a Sellmeier model with a pole inside the range', () => {
    const [line] = problems(materialInputSchema, {
      ...good,
      model: { model: 'sellmeier', B: [1.0], C: [0.3] },
      rangeNm: { from: 300, to: 900 },
    });
    expect(line).toMatch(/^model: .*no physical index/);
  });

  it('an edit carries the version it was based on', () => {
    expect(problems(materialUpdateSchema, good)).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(materialUpdateSchema.parse({ ...good, version: 4 }).version).toBe(4);
  });
});

describe('import schemas', () => {
  it('an n,k file import takes linear interpolation and no hold by default, and needs a provenance', () => {
    expect(
      importMaterialCsvSchema.parse({
        name: 'Film A',
        csv: '400,1.5\n900,1.4\n',
        provenance: { kind: 'measured', date: '2026-11-20', run: ' B2-118 ' },
      }),
    ).toEqual({
      name: 'Film A',
      csv: '400,1.5\n900,1.4\n',
      interpolation: 'linear',
      clamp: false,
      provenance: { kind: 'measured', source: '', run: 'B2-118', date: '2026-11-20', notes: '' },
    });
    expect(
      importMaterialCsvSchema.parse({ name: 'Film A', csv: '', typical: true, fileName: ' ' }).fileName,
    ).toBe('');
    expect(problems(importMaterialCsvSchema, { name: 'Film A', csv: '', unit: 'mm' })).toEqual([
      'unit: unit must be nm or um',
    ]);
  });

  it('a constants file import needs a name and the file name', () => {
    expect(problems(importConstantsFileSchema, { name: ' ', text: 'DATA:', fileName: '' })).toEqual([
      'name: Enter a name',
      'fileName: The file needs a name',
    ]);
  });
});
