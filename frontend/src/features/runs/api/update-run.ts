import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getRunQueryOptions, type RunDetailView } from './get-run';
import { getRunsQueryOptions, type DurabilityResult, type LayerReading, type RunView } from './get-runs';

/** UpdateRunDto: each field given replaces what the run had; `version` is the run's version it is based on. */
export interface RunChanges {
  version: number;
  layerReadings?: LayerReading[];
  durability?: DurabilityResult[];
  notes?: string;
}

export function updateRun(id: number, changes: RunChanges): Promise<RunView> {
  return apiClient.put<RunView>(`/runs/${id}`, changes);
}

/** Saves readings, durability results or notes of one run; the form shows refusals itself. */
export function useUpdateRun(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changes: RunChanges) => updateRun(id, changes),
    meta: { errorShownInline: true },
    onSuccess: (run) => {
      queryClient.setQueryData(getRunQueryOptions(id).queryKey, (old: RunDetailView | undefined) =>
        old ? { ...old, ...run } : old,
      );
      return queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
    },
  });
}
