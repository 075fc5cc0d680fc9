import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { ChamberInput } from '@quietglass/shared';
import { getChambersQueryOptions, type ChamberView } from './get-chambers';

export interface UpdateChamberInput {
  id: number;
  /** The version the edit started from; someone else's save in between gives 409. */
  version: number;
  chamber: ChamberInput;
}

export function updateChamber({ id, version, chamber }: UpdateChamberInput): Promise<ChamberView> {
  return apiClient.put<ChamberView>(`/chambers/${id}`, { ...chamber, version });
}

/** Replaces a chamber's settings; the form shows 400 and 409 itself. */
export function useUpdateChamber() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateChamber,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getChambersQueryOptions().queryKey }),
  });
}
