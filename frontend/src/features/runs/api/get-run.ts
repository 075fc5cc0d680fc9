import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunDetailView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { RunDetailView, RunSpectrumView } from '@quietglass/shared';

export function getRun(id: number, signal?: AbortSignal): Promise<RunDetailView> {
  return apiClient.get<RunDetailView>(`/runs/${id}`, signal);
}

export function getRunQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['runs', 'detail', id] as const,
    queryFn: ({ signal }) => getRun(id, signal),
  });
}

export function useRun(id: number) {
  return useQuery(getRunQueryOptions(id));
}
