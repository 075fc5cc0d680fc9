import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateRunInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getRunQueryOptions, type RunDetailView } from './get-run';
import { getRunsQueryOptions, type RunView } from './get-runs';

export function updateRun(id: number, changes: UpdateRunInput): Promise<RunView> {
  return apiClient.put<RunView>(`/runs/${id}`, changes);
}

/** Saves readings, durability results or notes of one run; the form shows refusals itself. */
export function useUpdateRun(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changes: UpdateRunInput) => updateRun(id, changes),
    meta: { errorShownInline: true },
    onSuccess: (run) => {
      queryClient.setQueryData(getRunQueryOptions(id).queryKey, (old: RunDetailView | undefined) =>
        old ? { ...old, ...run } : old,
      );
      return queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
    },
  });
}
