import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChamberView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { ChamberMaterialSetting, ChamberView } from '@quietglass/shared';

/** Every chamber, by name. */
export function getChambers(signal?: AbortSignal): Promise<ChamberView[]> {
  return apiClient.get<ChamberView[]>('/chambers', signal);
}

export function getChambersQueryOptions() {
  return queryOptions({
    queryKey: ['chambers', 'list'] as const,
    queryFn: ({ signal }) => getChambers(signal),
  });
}

export function useChambers() {
  return useQuery(getChambersQueryOptions());
}
