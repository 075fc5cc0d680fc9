import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChamberInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getChambersQueryOptions, type ChamberView } from './get-chambers';

export function createChamber(input: ChamberInput): Promise<ChamberView> {
  return apiClient.post<ChamberView>('/chambers', input);
}

/** A new chamber; the form shows the API's refusals itself. */
export function useCreateChamber() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createChamber,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getChambersQueryOptions().queryKey }),
  });
}
