/*
 * The audit trail's filters as the API reads them from the query string (values arrive as text).
 */
import { z } from 'zod';
import { AUDIT_ENTITIES } from '../audit.js';
import { queryRecordId } from './common.js';

/** A day as the filters take it (UTC, both ends included). */
function day(field: string) {
  return z.iso.date({ error: `${field} must be a date (YYYY-MM-DD)` });
}

export const auditQuerySchema = z
  .strictObject({
    entity: z
      .enum(AUDIT_ENTITIES, { error: `entity must be one of ${AUDIT_ENTITIES.join(', ')}` })
      .optional(),
    entityId: queryRecordId('entityId must be a record id').optional(),
    /** Shorthand for entity=design&entityId=… (the design filter of the Audit trail page). */
    designId: queryRecordId('designId must be a design id').optional(),
    actorId: queryRecordId('actorId must be a user id').optional(),
    from: day('from').optional(),
    to: day('to').optional(),
  })
  .superRefine((q, ctx) => {
    if (q.designId !== undefined && q.entity !== undefined && q.entity !== 'design')
      ctx.addIssue({
        code: 'custom',
        path: ['designId'],
        message: 'Use either designId or entity, not both',
      });
    // YYYY-MM-DD texts sort as the days they name.
    if (q.from !== undefined && q.to !== undefined && q.from > q.to)
      ctx.addIssue({
        code: 'custom',
        path: ['to'],
        message: `The last day must not be before the first (${q.from})`,
      });
  });
export type AuditQuery = z.output<typeof auditQuerySchema>;
