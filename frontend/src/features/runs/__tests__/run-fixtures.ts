import type { MaterialModel } from '@quietglass/shared';
import type { RecipeView, ReleasedRecipeView } from '../run-inputs';
import type { RunDetailView, RunSpectrumView } from '../api/get-run';
import type { SpectrumComparisonView } from '../api/get-spectrum-comparison';

/*
 * An invented scenario for tests: a four-layer AR recipe (design 12 version 1, MgF2 / ZrO2 / Al2O3 /
 * SiO2, incident side first) run in chamber 3 as lot L-2026-118. Thicknesses and readings are demo
 * numbers only.
 */
export const RECIPES: ReleasedRecipeView[] = [
  {
    designId: 12,
    number: 1,
    name: 'Lens AR trial',
    customer: 'Fenwick Optics Lab',
    releasedAt: '2026-12-01T09:00:00.000Z',
    releasedBy: 'Ines Review',
  },
  {
    designId: 15,
    number: 2,
    name: 'Window AR 532',
    customer: 'Orrin Imaging',
    releasedAt: '2026-11-30T09:00:00.000Z',
    releasedBy: 'Ines Review',
  },
];

export const CHAMBERS = [
  { id: 3, name: 'Box coater B2' },
  { id: 4, name: 'Box coater C1' },
];

const MODEL: MaterialModel = { model: 'constant', n: 1.5 };

export const RECIPE: RecipeView = {
  designId: 12,
  number: 1,
  name: 'Lens AR trial',
  status: 'released',
  rowVersion: 3,
  incidentMaterialId: 1,
  substrateMaterialId: 2,
  substrateThicknessMm: 2,
  backSurface: 'front-only',
  referenceWavelengthNm: 550,
  notes: '',
  layers: [
    { materialId: 10, thicknessNm: 96.8, locked: false, notes: '' },
    { materialId: 11, thicknessNm: 127.6, locked: false, notes: '' },
    { materialId: 12, thicknessNm: 84.2, locked: false, notes: '' },
    { materialId: 13, thicknessNm: 76.2, locked: false, notes: '' },
  ],
  createdBy: { id: 2, displayName: 'Tomas Reyne' },
  editors: [{ id: 2, displayName: 'Tomas Reyne' }],
  createdAt: '2026-11-30T08:00:00.000Z',
  updatedAt: '2026-12-01T09:00:00.000Z',
  materialsSnapshot: {
    '10': { name: 'MgF2', model: MODEL },
    '11': { name: 'ZrO2', model: MODEL },
    '12': { name: 'Al2O3', model: MODEL },
    '13': { name: 'SiO2', model: MODEL },
  },
};

export const SPECTRUM: RunSpectrumView = {
  id: 31,
  runId: 40,
  quantity: 'R',
  angleDeg: 8,
  sample: 'witness',
  filename: 'witness-118.csv',
  wavelengthsNm: [400, 500, 610, 700],
  valuesPercent: [0.4, 0.3, 0.7, 0.4],
  uploadedBy: 'Jonah Pell',
  uploadedAt: '2026-12-01T12:00:00.000Z',
};

export function testRun(overrides: Partial<RunDetailView> = {}): RunDetailView {
  return {
    id: 40,
    designId: 12,
    versionNumber: 1,
    chamberId: 3,
    lotNumber: 'L-2026-118',
    runDate: '2026-12-01',
    operator: { id: 4, displayName: 'Jonah Pell' },
    layerReadings: [],
    durability: [],
    notes: '',
    remarks: [],
    version: 3,
    createdAt: '2026-12-01T08:00:00.000Z',
    updatedAt: '2026-12-01T08:00:00.000Z',
    spectra: [],
    ...overrides,
  };
}

/**
 * The comparison of SPECTRUM against a mask "R ≤ 0.5 % over 420–680 nm": the 0.7 % reading at
 * 610 nm is the worst, margin 0.5 − 0.7 = −0.2 percentage points (the mask's definition of a
 * maximum), so the run fails.
 */
export const COMPARISON: SpectrumComparisonView = {
  spectrumId: 31,
  quantity: 'R',
  angleDeg: 8,
  measured: { wavelengthsNm: SPECTRUM.wavelengthsNm, valuesPercent: SPECTRUM.valuesPercent },
  design: { wavelengthsNm: [400, 500, 610, 700], valuesPercent: [0.35, 0.2, 0.3, 0.45] },
  mask: {
    name: 'HVS-2210 lens AR',
    revision: 'A',
    limits: [
      {
        from_nm: 420,
        to_nm: 680,
        angles_deg: [0, 15, 30],
        polarisation: 'avg',
        quantity: 'R',
        max_percent: 0.5,
        step_nm: 2,
      },
    ],
    pass: false,
    worstMargin: -0.2,
    worstBand: 0,
    bands: [
      {
        band: 0,
        evaluated: true,
        pass: false,
        worstMargin: -0.2,
        worstAt: { wavelengthNm: 610, valuePercent: 0.7 },
      },
    ],
  },
};
