import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from './get-calculation';

/** One design layer as Run diagnosis found it. */
export interface LayerDeviation {
  /** Design layer, 1 = outermost (incident side). */
  layer: number;
  materialId: number;
  designNm: number;
  fittedNm: number;
  /** fitted ÷ design. */
  factor: number;
  deviationPercent: number;
}

/** The summary of a completed Run diagnosis. */
export interface DiagnosisSummary {
  /** Ranked by |deviation|, largest first. */
  layers: LayerDeviation[];
  /** RMS difference between measured and fitted spectrum, percentage points. */
  residualRmsPercent: number;
}

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
