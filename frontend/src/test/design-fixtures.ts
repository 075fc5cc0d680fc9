import type { DesignVersionView, DesignView } from '@quietglass/shared';

/*
 * An invented design of an invented shop, for tests only. Materials are constant-index models so
 * expected values follow from closed-form results: MgF2 n = 1.38, TiO2 n = 2.35, glass n = 1.52.
 */
export const TEST_MATERIALS = [
  {
    id: 1,
    name: 'Air',
    model: { model: 'constant' as const, n: 1, k: 0 },
    rangeNm: { from: 150, to: 20000 },
  },
  {
    id: 2,
    name: 'Test glass',
    model: { model: 'constant' as const, n: 1.52, k: 0 },
    rangeNm: { from: 300, to: 2500 },
  },
  {
    id: 4,
    name: 'MgF2',
    model: { model: 'constant' as const, n: 1.38, k: 0 },
    rangeNm: { from: 200, to: 1100 },
  },
  {
    id: 5,
    name: 'TiO2',
    model: { model: 'constant' as const, n: 2.35, k: 0 },
    rangeNm: { from: 400, to: 1100 },
  },
];

export const TEST_DESIGN: DesignView = {
  id: 12,
  name: 'Lens AR trial',
  customer: { id: 3, name: 'Fenwick Optics Lab' },
  specMaskId: 6,
  createdBy: { id: 2, displayName: 'Tomas Reyne' },
  createdAt: '2026-12-01T08:00:00.000Z',
  version: 1,
  versions: [{ number: 1, status: 'draft', updatedAt: '2026-12-01T08:00:00.000Z', createdBy: 'Tomas Reyne' }],
};

export function testVersion(overrides: Partial<DesignVersionView> = {}): DesignVersionView {
  return {
    designId: 12,
    number: 1,
    status: 'draft',
    rowVersion: 1,
    incidentMaterialId: 1,
    substrateMaterialId: 2,
    substrateThicknessMm: 2,
    backSurface: 'front-only',
    referenceWavelengthNm: 550,
    notes: '',
    layers: [],
    createdBy: { id: 2, displayName: 'Tomas Reyne' },
    editors: [{ id: 2, displayName: 'Tomas Reyne' }],
    createdAt: '2026-12-01T08:00:00.000Z',
    updatedAt: '2026-12-01T08:00:00.000Z',
    materialsSnapshot: null,
    ...overrides,
  };
}
