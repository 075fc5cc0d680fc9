import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { startRunSchema } from '@quietglass/shared';
import type { z } from 'zod';
import { apiClient } from '../../../lib/api-client';
import { getRunsQueryOptions, type RunView } from './get-runs';

/** What the API's start-run schema accepts (notes may be left out); the signed-in user becomes the operator. */
export type StartRunRequest = z.input<typeof startRunSchema>;

export function startRun(input: StartRunRequest): Promise<RunView> {
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
