import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DesignView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** A design's header and the list of its versions. */
export function getDesign(id: number, signal?: AbortSignal): Promise<DesignView> {
  return apiClient.get<DesignView>(`/designs/${id}`, signal);
}

export function getDesignQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['designs', 'detail', id] as const,
    queryFn: ({ signal }) => getDesign(id, signal),
  });
}

export function useDesign(id: number) {
  return useQuery(getDesignQueryOptions(id));
}
