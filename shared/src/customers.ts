/*
 * Customers and the kinds of spec mask: rules the API, the client and the reports share.
 */

/**
 * What a spec mask is: the customer's own specification (what reports and quotes judge against),
 * or a target the shop set itself for design work, which never goes to the customer.
 */
export const SPEC_MASK_KINDS = ['customer', 'internal'] as const;
export type SpecMaskKind = (typeof SPEC_MASK_KINDS)[number];

/** How each kind is named on every page that shows a mask. */
export const SPEC_MASK_KIND_LABELS: Readonly<Record<SpecMaskKind, string>> = {
  customer: 'Customer specification',
  internal: 'Internal design target',
};

/** Masks that may stand in a compliance report or a quote: the customer's own specifications. */
export function isCustomerSpecification(mask: { kind: SpecMaskKind }): boolean {
  return mask.kind === 'customer';
}

/** A contact person at a customer. */
export interface CustomerContact {
  name: string;
  email: string;
  role?: string;
  phone?: string;
}

/**
 * Limits of a customer's record, checked by the shared customer schema (schemas/customers.ts);
 * contact e-mail addresses follow the accounts' e-mail rule (MAX_EMAIL_LENGTH).
 */
export const CUSTOMER_LIMITS = {
  name: 160,
  notes: 4000,
  contacts: 20,
  contactName: 120,
  contactRole: 80,
  contactPhone: 40,
} as const;

/** How a mask is named in pickers and headings: internal design targets always say so. */
export function specMaskLabel(mask: { name: string; revision: string; kind: SpecMaskKind }): string {
  const base = `${mask.name} rev ${mask.revision}`;
  return mask.kind === 'internal' ? `${base} (${SPEC_MASK_KIND_LABELS.internal.toLowerCase()})` : base;
}

/** One record of a customer as its page lists it: a mask, design, report or quote. */
export interface CustomerRecordLink {
  id: number;
  title: string;
  /** A mask's kind, a design's newest version status, a report's source (design or run), a quote's status. */
  status: string;
  at: string;
}

/** Everything on record for one customer, newest first. */
export interface CustomerRecords {
  masks: CustomerRecordLink[];
  designs: CustomerRecordLink[];
  reports: CustomerRecordLink[];
  quotes: CustomerRecordLink[];
}
