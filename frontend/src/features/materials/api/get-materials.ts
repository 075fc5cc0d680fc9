import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MaterialModel } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** A material of the library: its dispersion model, valid range and where the data came from. */
export interface MaterialView {
  id: number;
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  /** A typical value, not measured on this shop's process. */
  typical: boolean;
  provenance: { source: string; date: string | null; notes: string };
  /** Optimistic-locking counter: send it back with an edit. */
  version: number;
  updatedAt: string;
}

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
