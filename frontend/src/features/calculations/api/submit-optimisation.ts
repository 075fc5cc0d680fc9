import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from '../api/get-calculation';
import { getCalculationsQueryOptions } from '../api/get-calculations';

/** Body of POST …/fit (FitDto of the API); omitted fields take the API's defaults. */
export interface FitRequest {
  specMaskId?: number;
  minThicknessNm?: number;
  maxThicknessNm?: number;
  maxIterations?: number;
  /** Margin to design in beyond every limit, percentage points. */
  targetMarginPercent?: number;
}

/** Body of POST …/grow (GrowDto of the API). */
export interface GrowRequest extends FitRequest {
  allowedMaterialIds: number[];
  /** Allowed materials that may only be the outermost layer. */
  outermostOnlyMaterialIds?: number[];
  /** The only allowed materials a new layer next to the substrate may be. */
  nextToSubstrateMaterialIds?: number[];
  maxLayers?: number;
  maxTotalThicknessNm?: number;
  maxSteps?: number;
}

/** Body of POST …/yield (YieldDto of the API). */
export interface YieldRequest {
  specMaskId?: number;
  trials?: number;
  seed?: number;
  thickness: { relativePercent?: number; absoluteNm?: number; distribution?: 'normal' | 'uniform' };
  systematicPercent?: number;
  indexPercent?: number;
}

export type OptimisationKind = 'fit' | 'grow' | 'yield';

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
