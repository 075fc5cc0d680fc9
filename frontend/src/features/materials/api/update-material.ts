import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { MaterialInput } from './create-material';
import { getMaterialQueryOptions } from './get-material';
import { getMaterialsQueryOptions, type MaterialView } from './get-materials';

export interface UpdateMaterialInput {
  id: number;
  /** The version the edit started from; a stale one gets 409 and nothing changes. */
  version: number;
  material: MaterialInput;
}

export function updateMaterial({ id, version, material }: UpdateMaterialInput): Promise<MaterialView> {
  return apiClient.put<MaterialView>(`/materials/${id}`, { ...material, version });
}

/** Replaces a material; the form shows a 409 (changed by someone else) with a reload offer. */
export function useUpdateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMaterial,
    meta: { errorShownInline: true },
    onSuccess: (saved) => {
      queryClient.setQueryData(getMaterialQueryOptions(saved.id).queryKey, saved);
      return queryClient.invalidateQueries({ queryKey: getMaterialsQueryOptions().queryKey });
    },
  });
}
