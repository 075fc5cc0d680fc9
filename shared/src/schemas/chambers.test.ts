import { describe, expect, it } from 'vitest';
import { chamberInputSchema, chamberUpdateSchema } from './chambers.js';
import { issueLines } from './common.js';
import { problems } from './__tests__/problems.js';

const good = {
  name: '  Box coater 2 ',
  monitorWavelengthsNm: [550, 632.8],
  monitorChipMaterialId: 3,
  materials: [
    { materialId: 5, toolingFactor: 1.04, rateNmPerS: 0.8 },
    { materialId: 6, toolingFactor: 0.97, rateNmPerS: 0.3 },
  ],
};

const chamberProblems = (body: unknown) => problems(chamberInputSchema, body);

describe('chamber input schema', () => {
  it('trims the name and fills missing notes with empty text', () => {
    const parsed = chamberInputSchema.parse(good);
    expect(parsed.name).toBe('Box coater 2');
    expect(parsed.notes).toBe('');
    expect(parsed.materials).toEqual(good.materials);
  });

  it.each([
    [{ name: '   ' }, 'name: Enter a chamber name'],
    [{ name: 'x'.repeat(121) }, 'name: At most 120 characters'],
    [{ monitorWavelengthsNm: [] }, 'monitorWavelengthsNm: Enter at least one monitor wavelength'],
    [
      { monitorWavelengthsNm: [150] },
      'monitorWavelengthsNm.0: Monitor wavelengths must be between 200 and 3000 nm',
    ],
    [{ monitorWavelengthsNm: Array(9).fill(550) }, 'monitorWavelengthsNm: At most 8 monitor wavelengths'],
    [{ monitorChipMaterialId: 0 }, 'monitorChipMaterialId: Choose the material of the monitor chip'],
    [
      { materials: [{ materialId: 5, toolingFactor: -1, rateNmPerS: 1 }] },
      'materials.0.toolingFactor: Tooling factor must be greater than 0',
    ],
    [
      { materials: [{ materialId: 5, toolingFactor: 11, rateNmPerS: 1 }] },
      'materials.0.toolingFactor: Tooling factor must be at most 10',
    ],
    [
      { materials: [{ materialId: 5, toolingFactor: Number.NaN, rateNmPerS: 1 }] },
      'materials.0.toolingFactor: Enter the tooling factor as a number, e.g. 1.04',
    ],
    [
      { materials: [{ materialId: 5, toolingFactor: 1, rateNmPerS: 'fast' }] },
      'materials.0.rateNmPerS: Enter the rate in nm/s as a number, e.g. 0.8',
    ],
    [
      { materials: [{ materialId: 5, toolingFactor: 1, rateNmPerS: Number.POSITIVE_INFINITY }] },
      'materials.0.rateNmPerS: Enter the rate in nm/s as a number, e.g. 0.8',
    ],
    [
      { materials: [{ materialId: 5, toolingFactor: 1, rateNmPerS: 101 }] },
      'materials.0.rateNmPerS: Rate must be at most 100 nm/s',
    ],
    [
      {
        materials: [
          { materialId: 5, toolingFactor: 1, rateNmPerS: 1 },
          { materialId: 6, toolingFactor: 1, rateNmPerS: 1 },
          { materialId: 5, toolingFactor: 1.1, rateNmPerS: 1 },
        ],
      },
      'materials.2.materialId: This material is already listed in row 1',
    ],
    [{ notes: 'x'.repeat(4001) }, 'notes: At most 4000 characters'],
  ])('refuses %j with one message at the field', (patch, expected) => {
    expect(chamberProblems({ ...good, ...patch })).toEqual([expected]);
  });

  it('refuses a field it does not know, as the API did before', () => {
    expect(chamberProblems({ ...good, colour: 'red' })).toEqual(['Unrecognized key: "colour"']);
  });

  it('an edit needs the version it was based on', () => {
    const parsed = chamberUpdateSchema.safeParse(good);
    expect(parsed.success ? [] : issueLines(parsed.error)).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(chamberUpdateSchema.parse({ ...good, version: 4 }).version).toBe(4);
  });
});
