import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { DurabilityResult, DurabilityTest, LayerReading, RunView } from '@quietglass/shared';

/** The latest runs, newest first. */
export function getRuns(signal?: AbortSignal): Promise<RunView[]> {
  return apiClient.get<RunView[]>('/runs', signal);
}

export function getRunsQueryOptions() {
  return queryOptions({
    queryKey: ['runs', 'list'] as const,
    queryFn: ({ signal }) => getRuns(signal),
  });
}

export function useRuns() {
  return useQuery(getRunsQueryOptions());
}
