/*
 * The quote form's values and the API's rules for them (QuoteDto): contact e-mail; part description
 * 1–2000 characters; 1–20 quantity breaks, whole quantities ≥ 1 rising from break to break, unit
 * prices 0–1e9 with at most 4 decimals; a three-letter ISO 4217 currency; lead time 1–730 days;
 * validity date after today (UTC, the shop's calendar); terms at most 8000 characters.
 */
import type { Role } from '@quietglass/shared';
import { parseNumberInput, fieldText } from '../../lib/format';
import type { QuoteInput } from './api/create-quote';
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
  breaks: BreakValues[];
  currency: string;
  leadTimeDays: string;
  validUntil: string;
  terms: string;
}

/** Sales and admins write and send quotes; engineers only read them (the API's QuotesController). */
export function canWriteQuotes(role: Role): boolean {
  return role === 'admin' || role === 'sales';
}

export const MAX_PART_DESCRIPTION = 2000;
export const MAX_BREAKS = 20;
export const MAX_UNIT_PRICE = 1e9;
export const MAX_LEAD_TIME_DAYS = 730;
export const MAX_TERMS = 8000;

/** Today in the shop's calendar (UTC), YYYY-MM-DD, as the API compares validity dates. */
export function todayUtc(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** `days` after today (UTC), YYYY-MM-DD. */
export function daysFromToday(days: number, now: Date = new Date()): string {
  return todayUtc(new Date(now.getTime() + days * 86_400_000));
}

type Rule = (value: unknown) => true | string;

const text = (value: unknown) => (typeof value === 'string' ? value.trim() : '');

export const minQuantityRule: Rule = (value) => {
  const n = parseNumberInput(text(value));
  if (n === null) return 'Enter a quantity';
  if (!Number.isInteger(n)) return 'The quantity must be a whole number';
  return n >= 1 || 'The quantity must be at least 1';
};

/** Quantities must rise from one break to the next (checked on each break after the first). */
export function risingQuantityRule(previous: () => string | undefined): Rule {
  return (value) => {
    const basic = minQuantityRule(value);
    const earlier = previous();
    if (basic !== true || earlier === undefined) return basic;
    const before = parseNumberInput(earlier);
    const n = parseNumberInput(text(value)) as number;
    return before === null || n > before || 'Each break needs a larger quantity than the one before';
  };
}

export const unitPriceRule: Rule = (value) => {
  const t = text(value);
  const n = parseNumberInput(t);
  if (n === null) return 'Enter a unit price';
  if (n < 0) return 'The unit price must not be negative';
  if (n > MAX_UNIT_PRICE) return 'The unit price is too large';
  const decimals = /\.(\d+)$/.exec(t)?.[1]?.length ?? 0;
  return (decimals <= 4 && !/e/i.test(t)) || 'At most 4 decimals';
};

export const currencyRule: Rule = (value) =>
  /^[A-Z]{3}$/.test(text(value)) || 'A three-letter ISO 4217 code such as EUR or USD';

export const leadTimeRule: Rule = (value) => {
  const n = parseNumberInput(text(value));
  if (n === null) return 'Enter the lead time in days';
  if (!Number.isInteger(n)) return 'A whole number of days';
  return (n >= 1 && n <= MAX_LEAD_TIME_DAYS) || `Between 1 and ${MAX_LEAD_TIME_DAYS} days`;
};

export function validUntilRule(now: () => Date = () => new Date()): Rule {
  return (value) => {
    const t = text(value);
    if (t === '') return 'Enter the validity date';
    if (!/^\d{4}-\d{2}-\d{2}$/.test(t) || Number.isNaN(Date.parse(`${t}T00:00:00Z`)))
      return 'Enter a date (YYYY-MM-DD)';
    const today = todayUtc(now());
    return t > today || `The validity date must be in the future (after ${today})`;
  };
}

export const partDescriptionRule: Rule = (value) => {
  const t = text(value);
  if (t === '') return 'Describe the part';
  return t.length <= MAX_PART_DESCRIPTION || `At most ${MAX_PART_DESCRIPTION} characters`;
};

export const termsRule: Rule = (value) =>
  fieldText(value).length <= MAX_TERMS || `At most ${MAX_TERMS} characters`;

export function emptyQuoteValues(): QuoteFormValues {
  return {
    customerId: '',
    contactEmail: '',
    designId: '',
    versionNumber: '',
    specMaskId: '',
    partDescription: '',
    breaks: [{ minQuantity: '', unitPrice: '' }],
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
    breaks: q.quantityBreaks.map((b) => ({
      minQuantity: String(b.minQuantity),
      unitPrice: String(b.unitPrice),
    })),
    currency: q.currency,
    leadTimeDays: String(q.leadTimeDays),
    validUntil: q.validUntil,
    terms: q.terms,
  };
}

/** The request body of validated form values. */
export function quoteInput(v: QuoteFormValues): QuoteInput {
  return {
    customerId: Number(v.customerId),
    contactEmail: v.contactEmail.trim(),
    designId: Number(v.designId),
    versionNumber: Number(v.versionNumber),
    specMaskId: Number(v.specMaskId),
    partDescription: v.partDescription.trim(),
    quantityBreaks: v.breaks.map((b) => ({
      minQuantity: Number(b.minQuantity.trim()),
      unitPrice: Number(b.unitPrice.trim()),
    })),
    currency: v.currency.trim(),
    leadTimeDays: Number(v.leadTimeDays.trim()),
    validUntil: v.validUntil.trim(),
    terms: v.terms,
  };
}
