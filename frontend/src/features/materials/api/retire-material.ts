import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getMaterialQueryOptions } from './get-material';
import { getMaterialsQueryOptions, type MaterialView } from './get-materials';

export interface RetireMaterialInput {
  id: number;
  /** The version shown when the action was chosen; a stale one gets 409. */
  version: number;
  /** true retires (hidden from pickers), false restores. */
  retire: boolean;
}

export function retireMaterial({ id, version, retire }: RetireMaterialInput): Promise<MaterialView> {
  return apiClient.post<MaterialView>(`/materials/${id}/${retire ? 'retire' : 'restore'}`, { version });
}

/** Retires or restores a material; versions that use it keep it either way. */
export function useRetireMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: retireMaterial,
    onSuccess: (saved) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getMaterialsQueryOptions().queryKey }),
        queryClient.invalidateQueries({ queryKey: getMaterialQueryOptions(saved.id).queryKey }),
      ]),
  });
}

/** Where the original file of an imported material downloads from. */
export function materialSourceFilePath(id: number): string {
  return `/materials/${id}/source-file`;
}
