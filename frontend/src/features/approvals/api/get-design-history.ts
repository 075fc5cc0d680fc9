import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VersionEventView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { VersionEventView } from '@quietglass/shared';

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
