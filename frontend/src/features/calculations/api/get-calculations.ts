import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { isLive, type CalculationView } from './get-calculation';

/** How often the queue page refreshes while something waits or runs, ms. */
export const QUEUE_POLL_MS = 2000;

/** The latest 100 calculations, newest first. */
export function getCalculations(signal?: AbortSignal): Promise<CalculationView[]> {
  return apiClient.get<CalculationView[]>('/calculations', signal);
}

export function getCalculationsQueryOptions(pollMs = QUEUE_POLL_MS) {
  return queryOptions({
    queryKey: ['calculations', 'list'] as const,
    queryFn: ({ signal }) => getCalculations(signal),
    refetchInterval: (query) => (query.state.data?.some((c) => isLive(c.status)) ? pollMs : false),
    staleTime: 0,
  });
}

export function useCalculations(pollMs = QUEUE_POLL_MS) {
  return useQuery(getCalculationsQueryOptions(pollMs));
}
