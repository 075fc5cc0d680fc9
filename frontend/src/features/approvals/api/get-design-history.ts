import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VersionStatus } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** One step of a version's lifecycle as the audit trail records it. */
export interface VersionEventView {
  id: number;
  designId: number;
  versionNumber: number;
  from: VersionStatus;
  to: VersionStatus;
  actor: { id: number; displayName: string; role: string };
  comment: string;
  at: string;
}

/** Every lifecycle step of a design's versions, oldest first. */
export function getDesignHistory(designId: number, signal?: AbortSignal): Promise<VersionEventView[]> {
  return apiClient.get<VersionEventView[]>(`/designs/${designId}/history`, signal);
}

export function getDesignHistoryQueryOptions(designId: number) {
  return queryOptions({
    queryKey: ['designs', 'history', designId] as const,
    queryFn: ({ signal }) => getDesignHistory(designId, signal),
  });
}

export function useDesignHistory(designId: number) {
  return useQuery(getDesignHistoryQueryOptions(designId));
}
