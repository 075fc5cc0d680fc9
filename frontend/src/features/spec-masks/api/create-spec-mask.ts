import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpecMaskInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { SPEC_MASK_LISTS_KEY, type SpecMaskView } from './get-spec-masks';

export function createSpecMask(input: SpecMaskInput): Promise<SpecMaskView> {
  return apiClient.post<SpecMaskView>('/spec-masks', input);
}

/** A new mask; the form maps the engine's `bands[i].field` errors to its fields. */
export function useCreateSpecMask() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSpecMask,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: SPEC_MASK_LISTS_KEY }),
  });
}
