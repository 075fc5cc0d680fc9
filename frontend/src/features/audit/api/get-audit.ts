import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VersionEventView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export interface AuditFilter {
  designId?: number;
  actorId?: number;
}

/** The audit trail of every design's version lifecycle, newest first (the API returns at most 500). */
export function getAudit(filter: AuditFilter, signal?: AbortSignal): Promise<VersionEventView[]> {
  const query = new URLSearchParams();
  if (filter.designId !== undefined) query.set('designId', String(filter.designId));
  if (filter.actorId !== undefined) query.set('actorId', String(filter.actorId));
  const suffix = query.size > 0 ? `?${query.toString()}` : '';
  return apiClient.get<VersionEventView[]>(`/audit${suffix}`, signal);
}

export function getAuditQueryOptions(filter: AuditFilter = {}) {
  return queryOptions({
    queryKey: ['audit', { designId: filter.designId ?? null, actorId: filter.actorId ?? null }] as const,
    queryFn: ({ signal }) => getAudit(filter, signal),
  });
}

export function useAudit(filter: AuditFilter = {}) {
  return useQuery(getAuditQueryOptions(filter));
}
