/*
 * Quotes as the API and the client exchange them.
 */

/** Draft → sent → accepted or declined; a sent quote past its validity date reads as expired. */
export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'declined', 'expired'] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];

export interface QuantityBreak {
  /** Smallest order quantity this unit price applies to. */
  minQuantity: number;
  unitPrice: number;
}

/** One entry of a quote's history. */
export interface QuoteEvent {
  at: string;
  actor: string;
  action: string;
  detail?: string;
}

/** Today in the shop's calendar (UTC), YYYY-MM-DD: quotes are valid until a date of it. */
export function todayUtc(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** A quote as the API returns it. */
export interface QuoteView {
  id: number;
  customer: { id: number; name: string };
  contactEmail: string;
  designId: number;
  versionNumber: number;
  specMaskId: number;
  partDescription: string;
  quantityBreaks: QuantityBreak[];
  currency: string;
  leadTimeDays: number;
  /** YYYY-MM-DD. */
  validUntil: string;
  terms: string;
  status: QuoteStatus;
  reportIds: number[];
  history: QuoteEvent[];
  /** Why the last send failed; null after a successful one. */
  lastSendError: string | null;
  /** Optimistic-locking counter: send it back with an edit. */
  version: number;
  /** Display name of who wrote it. */
  createdBy: string;
  createdAt: string;
  updatedAt: string;
}
