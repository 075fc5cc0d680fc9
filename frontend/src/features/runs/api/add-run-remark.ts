import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getRunQueryOptions, type RunDetailView } from './get-run';
import type { RunView } from './get-runs';

/** RunRemarkDto: anyone who reads runs may add a remark; the run itself stays its operator's. */
export function addRunRemark(id: number, text: string): Promise<RunView> {
  return apiClient.post<RunView>(`/runs/${id}/remarks`, { text });
}

/** Adds a remark to one run; the form shows refusals itself. */
export function useAddRunRemark(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (text: string) => addRunRemark(id, text),
    meta: { errorShownInline: true },
    onSuccess: (run) =>
      queryClient.setQueryData(getRunQueryOptions(id).queryKey, (old: RunDetailView | undefined) =>
        old ? { ...old, ...run } : old,
      ),
  });
}
