import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DiagnosisSummary } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from './get-calculation';

export type { DiagnosisSummary, LayerDeviation } from '@quietglass/shared';

export interface StartDiagnosisInput {
  runId: number;
  spectrumId: number;
  /** Lowest and highest thickness factor a layer may have had. */
  factorRange: [number, number];
}

export type SubmittedDiagnosis = CalculationView & { reused: boolean };

export function startDiagnosis({ runId, spectrumId, factorRange }: StartDiagnosisInput) {
  return apiClient.post<SubmittedDiagnosis>(`/runs/${runId}/spectra/${spectrumId}/diagnosis`, {
    factorRange,
  });
}

/** Queues Run diagnosis of one measured spectrum on the compute queue. */
export function useStartDiagnosis() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startDiagnosis,
    meta: { errorShownInline: true },
    onSuccess: (calculation) => {
      const { reused: _reused, ...view } = calculation;
      queryClient.setQueryData(getCalculationQueryOptions(view.id).queryKey, view);
    },
  });
}

/** The diagnosis summary of a completed calculation, or null when it has none of that shape. */
export function diagnosisSummaryOf(calculation: CalculationView): DiagnosisSummary | null {
  const s = calculation.summary as Partial<DiagnosisSummary> | null;
  if (calculation.kind !== 'diagnosis' || !s || !Array.isArray(s.layers)) return null;
  return { layers: s.layers, residualRmsPercent: Number(s.residualRmsPercent) };
}
