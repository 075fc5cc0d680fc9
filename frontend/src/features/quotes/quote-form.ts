/*
 * The quote form's values, checked by the API's own quote schema (shared/src/schemas/quotes.ts):
 * the form parses its typed text and chosen ids, the schema holds them to its limits and messages.
 */
import { quoteInputSchema, todayUtc, type Role } from '@quietglass/shared';
import { z } from 'zod';
import { chosenId, requestFormSchema, typedNumber } from '../../lib/validation';
import type { QuoteView } from './api/get-quotes';

export interface BreakValues {
  minQuantity: string;
  unitPrice: string;
}

export interface QuoteFormValues {
  customerId: string;
  contactEmail: string;
  designId: string;
  versionNumber: string;
  specMaskId: string;
  partDescription: string;
  quantityBreaks: BreakValues[];
  currency: string;
  leadTimeDays: string;
  validUntil: string;
  terms: string;
}

/** Sales and admins write and send quotes; engineers only read them (the API's QuotesController). */
export function canWriteQuotes(role: Role): boolean {
  return role === 'admin' || role === 'sales';
}

/** `days` after today in the shop's calendar (UTC), YYYY-MM-DD. */
export function daysFromToday(days: number, now: Date = new Date()): string {
  return todayUtc(new Date(now.getTime() + days * 86_400_000));
}

/** The form's fields read as a quote request: typed numbers parsed, chosen ids as numbers. */
const typedQuote = z.object({
  customerId: chosenId,
  contactEmail: z.string(),
  designId: chosenId,
  versionNumber: chosenId,
  // The form always names the mask; NaN (none chosen) gets the API's message.
  specMaskId: chosenId,
  partDescription: z.string(),
  quantityBreaks: z.array(z.object({ minQuantity: typedNumber, unitPrice: typedNumber })),
  currency: z.string(),
  leadTimeDays: typedNumber,
  validUntil: z.string(),
  terms: z.string(),
});

/** The form's values checked as the API checks a quote; valid values become the request body. */
export const quoteFormSchema = requestFormSchema(typedQuote, quoteInputSchema);

export function emptyQuoteValues(): QuoteFormValues {
  return {
    customerId: '',
    contactEmail: '',
    designId: '',
    versionNumber: '',
    specMaskId: '',
    partDescription: '',
    quantityBreaks: [{ minQuantity: '', unitPrice: '' }],
    currency: 'EUR',
    leadTimeDays: '',
    // Common practice (no source): a quote is usually held open for about a month.
    validUntil: daysFromToday(30),
    terms: '',
  };
}

export function quoteValues(q: QuoteView): QuoteFormValues {
  return {
    customerId: String(q.customer.id),
    contactEmail: q.contactEmail,
    designId: String(q.designId),
    versionNumber: String(q.versionNumber),
    specMaskId: String(q.specMaskId),
    partDescription: q.partDescription,
    quantityBreaks: q.quantityBreaks.map((b) => ({
      minQuantity: String(b.minQuantity),
      unitPrice: String(b.unitPrice),
    })),
    currency: q.currency,
    leadTimeDays: String(q.leadTimeDays),
    validUntil: q.validUntil,
    terms: q.terms,
  };
}
