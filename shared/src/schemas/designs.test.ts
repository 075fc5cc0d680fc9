import { describe, expect, it } from 'vitest';
import {
  DESIGN_LIMITS,
  createDesignSchema,
  newVersionSchema,
  returnSchema,
  saveVersionSchema,
  submitSchema,
  transitionSchema,
  updateDesignSchema,
} from './designs.js';
import { problems } from './__tests__/problems.js';

const content = {
  incidentMaterialId: 1,
  substrateMaterialId: 2,
  substrateThicknessMm: 1.1,
  backSurface: 'bare',
  referenceWavelengthNm: 550,
  layers: [
    { materialId: 3, thicknessNm: 96.8 },
    { materialId: 4, thicknessNm: 120.4, locked: true, notes: 'outer' },
  ],
};
const design = { ...content, name: ' Lens AR ', customerId: 5 };

describe('design schemas', () => {
  it('trims the name and fills layer and version defaults', () => {
    const parsed = createDesignSchema.parse(design);
    expect(parsed.name).toBe('Lens AR');
    expect(parsed.notes).toBe('');
    expect(parsed.specMaskId).toBeUndefined();
    expect(parsed.layers).toEqual([
      { materialId: 3, thicknessNm: 96.8, locked: false, notes: '' },
      { materialId: 4, thicknessNm: 120.4, locked: true, notes: 'outer' },
    ]);
    expect(createDesignSchema.parse({ ...design, specMaskId: null }).specMaskId).toBeNull();
  });

  it.each([
    [{ name: '  ' }, 'name: Enter a name'],
    [{ customerId: 0 }, 'customerId: Choose the customer'],
    [{ specMaskId: 'HVS' }, 'specMaskId: Choose a spec mask'],
    [{ incidentMaterialId: 1.5 }, 'incidentMaterialId: Choose the incident medium'],
    [{ substrateThicknessMm: 0 }, 'substrateThicknessMm: Must be greater than 0 mm'],
    [{ substrateThicknessMm: 1001 }, 'substrateThicknessMm: Must be at most 1000 mm'],
    [{ backSurface: 'both' }, 'backSurface: Choose the back surface'],
    [{ referenceWavelengthNm: 99 }, 'referenceWavelengthNm: Must be from 100 to 20000 nm'],
    [{ referenceWavelengthNm: Number.NaN }, 'referenceWavelengthNm: Enter the reference wavelength in nm'],
    [{ notes: 'x'.repeat(8001) }, 'notes: At most 8000 characters'],
    [
      { layers: [{ materialId: 3, thicknessNm: 0 }] },
      'layers.0.thicknessNm: Thickness must be greater than 0 nm',
    ],
    [
      { layers: [{ materialId: 3, thicknessNm: 100_001 }] },
      'layers.0.thicknessNm: Thickness must be at most 100000 nm',
    ],
    [
      { layers: [{ materialId: 3, thicknessNm: Number.POSITIVE_INFINITY }] },
      'layers.0.thicknessNm: Enter the thickness in nm as a number',
    ],
    [{ layers: [{ materialId: 3, thicknessNm: 5, colour: 'red' }] }, 'layers.0: Unrecognized key: "colour"'],
    [
      { layers: [{ materialId: 3, thicknessNm: 5, notes: 'x'.repeat(501) }] },
      'layers.0.notes: At most 500 characters',
    ],
    [
      { layers: Array(DESIGN_LIMITS.maxLayers + 1).fill({ materialId: 3, thicknessNm: 5 }) },
      'layers: A design has at most 400 layers',
    ],
  ])('refuses %j with one message at the field', (patch, expected) => {
    expect(problems(createDesignSchema, { ...design, ...patch })).toEqual([expected]);
  });

  it('a save carries the row version it started from', () => {
    expect(problems(saveVersionSchema, content)).toEqual([
      'rowVersion: rowVersion must be the row version last read',
    ]);
    expect(saveVersionSchema.parse({ ...content, rowVersion: 2 }).rowVersion).toBe(2);
  });

  it('a rename or mask change carries the design version; both fields may be left out', () => {
    expect(updateDesignSchema.parse({ version: 3 })).toEqual({ version: 3 });
    expect(problems(updateDesignSchema, { name: 'New' })).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(problems(updateDesignSchema, { version: 3, name: '' })).toEqual(['name: Enter a name']);
  });

  it('a new version names the version it starts from and may bring stack-file content', () => {
    expect(newVersionSchema.parse({ fromNumber: 1 })).toEqual({ fromNumber: 1 });
    expect(
      problems(newVersionSchema, { fromNumber: 0, content: { ...content, layers: 'none' }, sourceFile: ' ' }),
    ).toEqual([
      'fromNumber: fromNumber must be the number of the version to start from',
      'content.layers: layers must be a list of layers',
      'sourceFile: Enter the name of the stack file',
    ]);
  });

  it('lifecycle steps: submit needs the row version, return a comment; comments are trimmed', () => {
    expect(transitionSchema.parse({ comment: '  checked the R curve ' })).toEqual({
      comment: 'checked the R curve',
    });
    expect(transitionSchema.parse({})).toEqual({});
    expect(transitionSchema.parse(undefined)).toEqual({});
    expect(problems(submitSchema, undefined)).toEqual([
      'rowVersion: rowVersion is required to submit: the row version you reviewed',
    ]);
    expect(problems(transitionSchema, { comment: 'x'.repeat(4001) })).toEqual([
      'comment: At most 4000 characters',
    ]);
    expect(problems(submitSchema, {})).toEqual([
      'rowVersion: rowVersion is required to submit: the row version you reviewed',
    ]);
    expect(problems(returnSchema, { comment: '   ' })).toEqual([
      'comment: A return needs a comment: say what to change',
    ]);
    expect(problems(transitionSchema, { reason: 'x' })).toEqual(['Unrecognized key: "reason"']);
  });
});
