import type { FitRequest, GrowRequest, YieldRequest } from '@quietglass/shared';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from '../api/get-calculation';
import { getCalculationsQueryOptions } from '../api/get-calculations';

export type OptimisationKind = 'fit' | 'grow' | 'yield';

/** Each body is the API's shared request schema (shared/src/schemas/optimise.ts). */
export type OptimisationInput =
  | { kind: 'fit'; designId: number; versionNumber: number; body: FitRequest }
  | { kind: 'grow'; designId: number; versionNumber: number; body: GrowRequest }
  | { kind: 'yield'; designId: number; versionNumber: number; body: YieldRequest };

/** A queued optimisation, or (`reused`) an identical one already queued, running or done. */
export type SubmittedOptimisation = CalculationView & { reused: boolean };

/** Queues Fit to mask, Grow layers or Yield forecast for a saved version. */
export function submitOptimisation({
  kind,
  designId,
  versionNumber,
  body,
}: OptimisationInput): Promise<SubmittedOptimisation> {
  return apiClient.post<SubmittedOptimisation>(
    `/designs/${designId}/versions/${versionNumber}/${kind}`,
    body,
  );
}

/** Queues an optimisation; the form shows a refusal (400) itself. */
export function useSubmitOptimisation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitOptimisation,
    meta: { errorShownInline: true },
    onSuccess: (calculation) => {
      const { reused: _reused, ...view } = calculation;
      queryClient.setQueryData(getCalculationQueryOptions(view.id).queryKey, view);
      return queryClient.invalidateQueries({ queryKey: getCalculationsQueryOptions().queryKey });
    },
  });
}
