import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateDesignInput, DesignView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getDesignsQueryOptions } from './get-designs';

export function createDesign(input: CreateDesignInput): Promise<DesignView> {
  return apiClient.post<DesignView>('/designs', input);
}

/** A new design whose version 1 is an empty draft; the dialog shows errors itself. */
export function useCreateDesign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDesign,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getDesignsQueryOptions().queryKey }),
  });
}
