import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpecMaskInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getSpecMaskQueryOptions } from './get-spec-mask';
import { SPEC_MASK_LISTS_KEY, type SpecMaskView } from './get-spec-masks';

export interface UpdateSpecMaskInput {
  id: number;
  version: number;
  mask: SpecMaskInput;
}

export function updateSpecMask({ id, version, mask }: UpdateSpecMaskInput): Promise<SpecMaskView> {
  return apiClient.put<SpecMaskView>(`/spec-masks/${id}`, { ...mask, version });
}

/** Replaces a mask's bands and details; 409 when someone else saved it first. */
export function useUpdateSpecMask() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateSpecMask,
    meta: { errorShownInline: true },
    onSuccess: (saved) => {
      queryClient.setQueryData(getSpecMaskQueryOptions(saved.id).queryKey, saved);
      return queryClient.invalidateQueries({ queryKey: SPEC_MASK_LISTS_KEY });
    },
  });
}
