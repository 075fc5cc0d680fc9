import { describe, expect, it } from 'vitest';
import { todayUtc } from '../quotes.js';
import { attachReportsSchema, quoteDecisionSchema, quoteInputSchema, quoteUpdateSchema } from './quotes.js';
import { problems } from './__tests__/problems.js';

const inDays = (d: number) => todayUtc(new Date(Date.now() + d * 86_400_000));

const quote = () => ({
  customerId: 3,
  contactEmail: ' Buyer@Fenwick.example ',
  designId: 12,
  versionNumber: 3,
  partDescription: ' Ø25 mm lens, AR one side ',
  quantityBreaks: [
    { minQuantity: 10, unitPrice: 42.5 },
    { minQuantity: 100, unitPrice: 31.1234 },
  ],
  currency: 'EUR',
  leadTimeDays: 21,
  validUntil: inDays(30),
});

describe('quote schemas', () => {
  it('trims the text, lower-cases the address and fills missing terms; the mask may be left out', () => {
    const parsed = quoteInputSchema.parse(quote());
    expect(parsed).toMatchObject({
      contactEmail: 'buyer@fenwick.example',
      partDescription: 'Ø25 mm lens, AR one side',
      terms: '',
    });
    expect(parsed.specMaskId).toBeUndefined();
    expect(parsed.quantityBreaks).toEqual(quote().quantityBreaks);
  });

  it.each([
    [{ customerId: 0 }, 'customerId: Choose the customer'],
    [{ contactEmail: 'nope' }, 'contactEmail: Enter a valid e-mail address'],
    [{ versionNumber: 1.5 }, 'versionNumber: Choose an approved version'],
    [{ specMaskId: Number.NaN }, "specMaskId: Choose the customer's spec mask the quote refers to"],
    [{ partDescription: ' ' }, 'partDescription: Describe the part'],
    [{ partDescription: 'x'.repeat(2001) }, 'partDescription: At most 2000 characters'],
    [{ quantityBreaks: [] }, 'quantityBreaks: Give at least one quantity break'],
    [
      { quantityBreaks: Array.from({ length: 21 }, (_, i) => ({ minQuantity: i + 1, unitPrice: 1 })) },
      'quantityBreaks: At most 20 quantity breaks',
    ],
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: -1 }] },
      'quantityBreaks.0.unitPrice: The unit price must not be negative',
    ],
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: 1.00001 }] },
      'quantityBreaks.0.unitPrice: At most 4 decimals',
    ],
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: 1e-7 }] },
      'quantityBreaks.0.unitPrice: At most 4 decimals',
    ],
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: 2e9 }] },
      'quantityBreaks.0.unitPrice: The unit price is too large',
    ],
    [
      { quantityBreaks: [{ minQuantity: 0.5, unitPrice: 1 }] },
      'quantityBreaks.0.minQuantity: The quantity must be a whole number',
    ],
    [
      { quantityBreaks: [{ minQuantity: 0, unitPrice: 1 }] },
      'quantityBreaks.0.minQuantity: The quantity must be at least 1',
    ],
    [
      {
        quantityBreaks: [
          { minQuantity: 100, unitPrice: 1 },
          { minQuantity: 100, unitPrice: 2 },
        ],
      },
      'quantityBreaks.1.minQuantity: Each break needs a larger quantity than the one before',
    ],
    [{ currency: 'euro' }, 'currency: A three-letter ISO 4217 code such as EUR or USD'],
    [{ leadTimeDays: 731 }, 'leadTimeDays: Between 1 and 730 days'],
    [{ leadTimeDays: 2.5 }, 'leadTimeDays: A whole number of days'],
    [{ validUntil: '' }, 'validUntil: Enter the validity date'],
    [{ validUntil: '2026-02-30' }, 'validUntil: Enter a date (YYYY-MM-DD)'],
    [{ validUntil: todayUtc() }, `validUntil: The validity date must be in the future (after ${todayUtc()})`],
    [{ terms: 'x'.repeat(8001) }, 'terms: At most 8000 characters'],
    [{ colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses %j', (patch, line) => {
    expect(problems(quoteInputSchema, { ...quote(), ...patch })).toContain(line);
  });

  it('keeps prices of four decimals and tomorrow as the validity date', () => {
    const body = {
      ...quote(),
      validUntil: inDays(1),
      quantityBreaks: [{ minQuantity: 1, unitPrice: 0.0001 }],
    };
    expect(problems(quoteInputSchema, body)).toEqual([]);
  });

  it('an edit needs the version it was based on', () => {
    expect(problems(quoteUpdateSchema, quote())).toEqual([
      'version: version must be the version number last read',
    ]);
  });

  it('attaches at most 10 reports by id, and takes accepted or declined as the answer', () => {
    expect(problems(attachReportsSchema, { reportIds: [1, 'x'] })).toEqual([
      'reportIds.1: reportIds must hold report ids',
    ]);
    expect(problems(attachReportsSchema, { reportIds: Array.from({ length: 11 }, (_, i) => i + 1) })).toEqual(
      ['reportIds: At most 10 reports at once'],
    );
    expect(quoteDecisionSchema.parse({ status: 'accepted' })).toEqual({ status: 'accepted' });
    expect(problems(quoteDecisionSchema, { status: 'maybe' })).toEqual([
      'status: status must be accepted or declined',
    ]);
    expect(problems(quoteDecisionSchema, { status: 'declined', note: 'x'.repeat(2001) })).toEqual([
      'note: At most 2000 characters',
    ]);
  });
});
