import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getDesignQueryOptions } from './get-design';
import { getDesignsQueryOptions } from './get-designs';

export interface UpdateDesignInput {
  id: number;
  name: string;
  specMaskId: number | null;
  /** The design's version token the change started from (a stale one gets 409). */
  version: number;
}

/** Renames a design or points it at another of its customer's spec masks. */
export function updateDesign({ id, ...body }: UpdateDesignInput): Promise<DesignView> {
  return apiClient.patch<DesignView>(`/designs/${id}`, body);
}

export function useUpdateDesign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateDesign,
    meta: { errorShownInline: true },
    onSuccess: (design) => {
      queryClient.setQueryData(getDesignQueryOptions(design.id).queryKey, design);
      return queryClient.invalidateQueries({ queryKey: getDesignsQueryOptions().queryKey });
    },
  });
}
