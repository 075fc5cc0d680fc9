import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { MaterialView } from './get-materials';

/** One material, as saved now (used to reload after someone else changed it). */
export function getMaterial(id: number, signal?: AbortSignal): Promise<MaterialView> {
  return apiClient.get<MaterialView>(`/materials/${id}`, signal);
}

export function getMaterialQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['materials', 'detail', id] as const,
    queryFn: ({ signal }) => getMaterial(id, signal),
  });
}

export function useMaterial(id: number) {
  return useQuery(getMaterialQueryOptions(id));
}
