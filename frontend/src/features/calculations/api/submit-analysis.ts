import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnalysisRequest } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from './get-calculation';
import { getCalculationsQueryOptions } from './get-calculations';

export interface SubmitAnalysisInput {
  designId: number;
  versionNumber: number;
  request: AnalysisRequest;
}

/** A queued calculation, or (`reused`) an identical one already queued, running or done. */
export type SubmittedAnalysis = CalculationView & { reused: boolean };

export function submitAnalysis({
  designId,
  versionNumber,
  request,
}: SubmitAnalysisInput): Promise<SubmittedAnalysis> {
  return apiClient.post<SubmittedAnalysis>(
    `/designs/${designId}/versions/${versionNumber}/analysis`,
    request,
  );
}

/** Queues a full analysis of a saved version; the panel shows errors itself. */
export function useSubmitAnalysis() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitAnalysis,
    meta: { errorShownInline: true },
    onSuccess: (calculation) => {
      const { reused: _reused, ...view } = calculation;
      queryClient.setQueryData(getCalculationQueryOptions(view.id).queryKey, view);
      return queryClient.invalidateQueries({ queryKey: getCalculationsQueryOptions().queryKey });
    },
  });
}
