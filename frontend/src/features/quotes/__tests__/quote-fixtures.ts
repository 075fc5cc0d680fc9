import type { DesignSummaryView, DesignView } from '@quietglass/shared';
import type { QuoteView } from '../api/get-quotes';

/* An invented shop's invented customers, designs and quotes, for tests only. */

export const CUSTOMERS = [
  { id: 3, name: 'Fenwick Optics Lab', contactEmail: 'buyer@fenwick.example', notes: '' },
  { id: 5, name: 'Marlow Scopes', contactEmail: null, notes: '' },
];

export const DESIGN_SUMMARIES: DesignSummaryView[] = [
  {
    id: 12,
    name: 'Fenwick lens AR',
    customer: { id: 3, name: 'Fenwick Optics Lab' },
    specMaskId: 6,
    latestVersion: { number: 4, status: 'draft', updatedAt: '2026-12-01T08:00:00.000Z' },
    createdBy: { id: 2, displayName: 'Tomas Reyne' },
    createdAt: '2026-11-20T08:00:00.000Z',
    version: 1,
  },
  {
    id: 14,
    name: 'Marlow window AR',
    customer: { id: 5, name: 'Marlow Scopes' },
    specMaskId: 7,
    latestVersion: { number: 1, status: 'approved', updatedAt: '2026-12-01T08:00:00.000Z' },
    createdBy: { id: 2, displayName: 'Tomas Reyne' },
    createdAt: '2026-11-21T08:00:00.000Z',
    version: 1,
  },
];

const at = '2026-12-01T08:00:00.000Z';
/** Design 12 with a version in every state but "submitted": only 2 and 3 may be quoted. */
export const DESIGN_12: DesignView = {
  ...DESIGN_SUMMARIES[0]!,
  versions: [
    { number: 1, status: 'retired', updatedAt: at, createdBy: 'Tomas Reyne' },
    { number: 2, status: 'released', updatedAt: at, createdBy: 'Tomas Reyne' },
    { number: 3, status: 'approved', updatedAt: at, createdBy: 'Tomas Reyne' },
    { number: 4, status: 'draft', updatedAt: at, createdBy: 'Tomas Reyne' },
    { number: 5, status: 'returned', updatedAt: at, createdBy: 'Tomas Reyne' },
  ],
};

export const MASKS = [
  {
    id: 6,
    name: 'Fenwick lens AR',
    revision: 'A',
    kind: 'customer' as const,
    customer: { id: 3, name: 'Fenwick Optics Lab' },
    bands: [],
    notes: '',
    version: 1,
    updatedAt: at,
  },
  {
    id: 7,
    name: 'Marlow window',
    revision: 'B',
    kind: 'customer' as const,
    customer: { id: 5, name: 'Marlow Scopes' },
    bands: [],
    notes: '',
    version: 1,
    updatedAt: at,
  },
  {
    id: 8,
    name: 'Fenwick design target',
    revision: 'T',
    kind: 'internal' as const,
    customer: { id: 3, name: 'Fenwick Optics Lab' },
    bands: [],
    notes: '',
    version: 1,
    updatedAt: at,
  },
];

export function testQuote(overrides: Partial<QuoteView> = {}): QuoteView {
  return {
    id: 21,
    customer: { id: 3, name: 'Fenwick Optics Lab' },
    contactEmail: 'buyer@fenwick.example',
    designId: 12,
    versionNumber: 3,
    specMaskId: 6,
    partDescription: 'Ø25 mm lens, AR one side',
    quantityBreaks: [
      { minQuantity: 10, unitPrice: 42.5 },
      { minQuantity: 100, unitPrice: 31 },
    ],
    currency: 'EUR',
    leadTimeDays: 21,
    validUntil: '2099-01-31',
    terms: 'Ex works.',
    status: 'draft',
    reportIds: [],
    history: [{ at, actor: 'Ines Calder', action: 'created' }],
    lastSendError: null,
    version: 1,
    createdBy: 'Ines Calder',
    createdAt: at,
    updatedAt: at,
    ...overrides,
  };
}
