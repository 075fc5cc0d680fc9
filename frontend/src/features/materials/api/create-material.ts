import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MaterialModel, ProvenanceKind } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getMaterialsQueryOptions, type MaterialView } from './get-materials';

export interface MaterialInput {
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  typical: boolean;
  /** Required: published (with its reference), measured (with date and run) or typical. */
  provenance: { kind: ProvenanceKind; source: string; date?: string; run?: string; notes: string };
}

export function createMaterial(input: MaterialInput): Promise<MaterialView> {
  return apiClient.post<MaterialView>('/materials', input);
}

/** Adds a material to the library; the form shows errors itself. */
export function useCreateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMaterial,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMaterialsQueryOptions().queryKey }),
  });
}
