import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MaterialView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { MaterialView } from '@quietglass/shared';

/** The materials library, by name. */
export function getMaterials(signal?: AbortSignal): Promise<MaterialView[]> {
  return apiClient.get<MaterialView[]>('/materials', signal);
}

export function getMaterialsQueryOptions() {
  return queryOptions({
    queryKey: ['materials', 'list'] as const,
    queryFn: ({ signal }) => getMaterials(signal),
  });
}

export function useMaterials() {
  return useQuery(getMaterialsQueryOptions());
}
