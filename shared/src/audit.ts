/**
 * The audit trail as the API and the client exchange it: every change to a record that matters,
 * with who made it and when. Entries are written in the same transaction as the change and never
 * edited or deleted.
 */

/** The kinds of record the audit trail covers. */
export const AUDIT_ENTITIES = [
  'user',
  'material',
  'spec-mask',
  'customer',
  'design',
  'quote',
  'run',
  'chamber',
  'chamber-calibration',
  'calibration-settings',
  'shop-settings',
] as const;
export type AuditEntity = (typeof AUDIT_ENTITIES)[number];

/** What people call each kind of record on the Audit trail page and in the CSV export. */
export const AUDIT_ENTITY_LABELS: Record<AuditEntity, string> = {
  user: 'User',
  material: 'Material',
  'spec-mask': 'Spec mask',
  customer: 'Customer',
  design: 'Stack design',
  quote: 'Quote',
  run: 'Chamber run',
  chamber: 'Chamber',
  'chamber-calibration': 'Chamber calibration',
  'calibration-settings': 'Calibration settings',
  'shop-settings': 'Shop settings',
};

/** One entry of the audit trail. */
export interface AuditEventView {
  id: number;
  at: string;
  /** Null only for changes made by the system itself (e.g. the demo seed). */
  actor: { id: number; displayName: string; role: string } | null;
  entity: AuditEntity;
  entityId: number;
  /** A short verb phrase: created, edited, renamed, submitted, approval refused, sent… */
  action: string;
  /** One line a person reads: what changed, from what to what. */
  summary: string;
  details: Record<string, unknown>;
}

/** Filters of the audit trail; dates are YYYY-MM-DD in UTC, both ends included. */
export interface AuditFilter {
  entity?: AuditEntity;
  entityId?: number;
  actorId?: number;
  from?: string;
  to?: string;
}

/** Most entries one request returns (the CSV export returns every match). */
export const AUDIT_PAGE_LIMIT = 500;
