import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DesignSummaryView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** Every stack design with its latest version, most recently changed first. */
export function getDesigns(signal?: AbortSignal): Promise<DesignSummaryView[]> {
  return apiClient.get<DesignSummaryView[]>('/designs', signal);
}

export function getDesignsQueryOptions() {
  return queryOptions({
    queryKey: ['designs', 'list'] as const,
    queryFn: ({ signal }) => getDesigns(signal),
  });
}

export function useDesigns() {
  return useQuery(getDesignsQueryOptions());
}
