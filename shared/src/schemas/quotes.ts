/*
 * What the quote form sends and the API accepts: a quote with its quantity breaks, the reports
 * attached to it and the customer's answer. One schema for both, so a limit or a message is
 * changed in one place.
 */
import { z } from 'zod';
import { todayUtc } from '../quotes.js';
import { finiteNumber, optionalText, recordId, requiredText, versionToken } from './common.js';
import { emailField } from './users.js';

/** Limits of a quote; they catch typing slips — common practice (no source). */
export const QUOTE_LIMITS = {
  partDescription: 2000,
  breaks: 20,
  unitPrice: 1e9,
  priceDecimals: 4,
  leadTimeDays: 730,
  terms: 8000,
  decisionNote: 2000,
  reportsAttachedAtOnce: 10,
} as const;

/** Decimal places of a number as written in the shortest form JavaScript prints it. */
function decimalPlaces(value: number): number {
  const [mantissa = '', exponent = '0'] = String(value).toLowerCase().split('e');
  const fraction = mantissa.split('.')[1] ?? '';
  return Math.max(0, fraction.length - Number(exponent));
}

export const quantityBreakSchema = z.strictObject({
  minQuantity: z
    .number({ error: 'Enter a quantity' })
    .int({ error: 'The quantity must be a whole number' })
    .min(1, { error: 'The quantity must be at least 1' }),
  unitPrice: finiteNumber('Enter a unit price')
    .min(0, { error: 'The unit price must not be negative' })
    .max(QUOTE_LIMITS.unitPrice, { error: 'The unit price is too large' })
    .refine((price) => decimalPlaces(price) <= QUOTE_LIMITS.priceDecimals, {
      error: `At most ${QUOTE_LIMITS.priceDecimals} decimals`,
    }),
});

/** Prices per order quantity; each break starts at a larger quantity than the one before. */
const quantityBreaksSchema = z
  .array(quantityBreakSchema, { error: 'quantityBreaks must be a list of quantity breaks' })
  .min(1, { error: 'Give at least one quantity break' })
  .max(QUOTE_LIMITS.breaks, { error: `At most ${QUOTE_LIMITS.breaks} quantity breaks` })
  .superRefine((breaks, ctx) => {
    breaks.forEach((b, index) => {
      const before = index > 0 ? breaks[index - 1] : undefined;
      if (before && b.minQuantity <= before.minQuantity)
        ctx.addIssue({
          code: 'custom',
          path: [index, 'minQuantity'],
          message: 'Each break needs a larger quantity than the one before',
        });
    });
  });

const { leadTimeDays: MAX_LEAD } = QUOTE_LIMITS;

/** YYYY-MM-DD after today in the shop's calendar (UTC), checked when the request arrives. */
const validUntilField = z
  .string({ error: 'Enter the validity date' })
  .trim()
  .min(1, { error: 'Enter the validity date', abort: true })
  .pipe(z.iso.date({ error: 'Enter a date (YYYY-MM-DD)' }))
  .refine((date) => date > todayUtc(), {
    error: () => `The validity date must be in the future (after ${todayUtc()})`,
  });

export const quoteInputSchema = z.strictObject({
  customerId: recordId('Choose the customer'),
  contactEmail: emailField,
  designId: recordId('Choose the design'),
  versionNumber: recordId('Choose an approved version'),
  /** The design's own spec mask when left out. */
  specMaskId: recordId("Choose the customer's spec mask the quote refers to").optional(),
  partDescription: requiredText('Describe the part', QUOTE_LIMITS.partDescription),
  quantityBreaks: quantityBreaksSchema,
  currency: z
    .string({ error: 'A three-letter ISO 4217 code such as EUR or USD' })
    .trim()
    .regex(/^[A-Z]{3}$/, { error: 'A three-letter ISO 4217 code such as EUR or USD' }),
  leadTimeDays: z
    .number({ error: 'Enter the lead time in days' })
    .int({ error: 'A whole number of days' })
    .min(1, { error: `Between 1 and ${MAX_LEAD} days` })
    .max(MAX_LEAD, { error: `Between 1 and ${MAX_LEAD} days` }),
  validUntil: validUntilField,
  terms: optionalText(QUOTE_LIMITS.terms),
});
/** A new quote as the API receives it (after trimming and defaults). */
export type QuoteInput = z.output<typeof quoteInputSchema>;

/** An edit of a draft carries the version it was based on. */
export const quoteUpdateSchema = quoteInputSchema.extend({ version: versionToken });
export type QuoteUpdate = z.output<typeof quoteUpdateSchema>;

/** Compliance reports to send with a draft (of its own design version). */
export const attachReportsSchema = z.strictObject({
  reportIds: z
    .array(recordId('reportIds must hold report ids'), { error: 'reportIds must be a list of report ids' })
    .max(QUOTE_LIMITS.reportsAttachedAtOnce, {
      error: `At most ${QUOTE_LIMITS.reportsAttachedAtOnce} reports at once`,
    }),
});
export type AttachReportsInput = z.output<typeof attachReportsSchema>;

/** The customer's answer to a sent quote. */
export const quoteDecisionSchema = z.strictObject({
  status: z.enum(['accepted', 'declined'], { error: 'status must be accepted or declined' }),
  note: optionalText(QUOTE_LIMITS.decisionNote).unwrap().optional(),
});
export type QuoteDecisionInput = z.output<typeof quoteDecisionSchema>;
export type QuoteDecision = QuoteDecisionInput['status'];
