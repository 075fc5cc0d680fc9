import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getRunsQueryOptions, type RunView } from './get-runs';

/** StartRunDto: the signed-in user becomes the run's operator. */
export interface StartRunInput {
  designId: number;
  versionNumber: number;
  chamberId: number;
  lotNumber: string;
  /** YYYY-MM-DD. */
  runDate: string;
  notes?: string;
}

export function startRun(input: StartRunInput): Promise<RunView> {
  return apiClient.post<RunView>('/runs', input);
}

/** Starts a run of a released recipe; the dialog shows refusals itself. */
export function useStartRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startRun,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey }),
  });
}
