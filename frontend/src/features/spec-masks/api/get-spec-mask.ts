import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { SpecMaskView } from './get-spec-masks';

export function getSpecMask(id: number, signal?: AbortSignal): Promise<SpecMaskView> {
  return apiClient.get<SpecMaskView>(`/spec-masks/${id}`, signal);
}

export function getSpecMaskQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['spec-masks', 'detail', id] as const,
    queryFn: ({ signal }) => getSpecMask(id, signal),
  });
}

/** One spec mask; nothing is fetched for a null id (a design without a mask). */
export function useSpecMask(id: number | null) {
  return useQuery({ ...getSpecMaskQueryOptions(id ?? 0), enabled: id !== null });
}
