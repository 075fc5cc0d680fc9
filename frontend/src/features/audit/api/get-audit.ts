import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventView, AuditFilter } from '@quietglass/shared';
import { apiClient, apiUrl } from '../../../lib/api-client';

export type { AuditFilter };

/** The filter as the API's query string (the same for the list and the CSV export). */
export function auditQuery(filter: AuditFilter): string {
  const query = new URLSearchParams();
  if (filter.entity !== undefined) query.set('entity', filter.entity);
  if (filter.entityId !== undefined) query.set('entityId', String(filter.entityId));
  if (filter.actorId !== undefined) query.set('actorId', String(filter.actorId));
  if (filter.from !== undefined) query.set('from', filter.from);
  if (filter.to !== undefined) query.set('to', filter.to);
  return query.size > 0 ? `?${query.toString()}` : '';
}

/** The audit trail, newest first (the API returns at most 500; the CSV export has every match). */
export function getAudit(filter: AuditFilter, signal?: AbortSignal): Promise<AuditEventView[]> {
  return apiClient.get<AuditEventView[]>(`/audit${auditQuery(filter)}`, signal);
}

/** Where the browser downloads the CSV export of the same filter. */
export function auditCsvUrl(filter: AuditFilter): string {
  return apiUrl(`/audit/export.csv${auditQuery(filter)}`);
}

export function getAuditQueryOptions(filter: AuditFilter = {}) {
  return queryOptions({
    queryKey: [
      'audit',
      {
        entity: filter.entity ?? null,
        entityId: filter.entityId ?? null,
        actorId: filter.actorId ?? null,
        from: filter.from ?? null,
        to: filter.to ?? null,
      },
    ] as const,
    queryFn: ({ signal }) => getAudit(filter, signal),
  });
}

export function useAudit(filter: AuditFilter = {}) {
  return useQuery(getAuditQueryOptions(filter));
}
