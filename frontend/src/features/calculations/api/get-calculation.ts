import { queryOptions, useQuery } from '@tanstack/react-query';
import type {
  AnalysisRequest,
  AnalysisSummary,
  CalculationStatus,
  CalculationView,
} from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { CalculationKind, CalculationStatus, CalculationView } from '@quietglass/shared';

/** A full analysis: its request and summary have the analysis shapes. */
export interface AnalysisCalculationView extends CalculationView {
  kind: 'analysis';
  request: AnalysisRequest;
  summary: AnalysisSummary | null;
}

export function isAnalysis(calculation: CalculationView): calculation is AnalysisCalculationView {
  return calculation.kind === 'analysis';
}

/** How often a queued or running calculation is asked for its progress, ms. */
export const CALCULATION_POLL_MS = 500;

export function isLive(status: CalculationStatus): boolean {
  return status === 'queued' || status === 'running';
}

export function getCalculation(id: number, signal?: AbortSignal): Promise<CalculationView> {
  return apiClient.get<CalculationView>(`/calculations/${id}`, signal);
}

export function getCalculationQueryOptions(id: number, pollMs = CALCULATION_POLL_MS) {
  return queryOptions({
    queryKey: ['calculations', 'detail', id] as const,
    queryFn: ({ signal }) => getCalculation(id, signal),
    // Polled while it waits or runs, for the progress bar; a finished one does not change.
    refetchInterval: (query) => (query.state.data && isLive(query.state.data.status) ? pollMs : false),
    staleTime: 0,
  });
}

/** One calculation, polled until it finishes; nothing is fetched for a null id. */
export function useCalculation(id: number | null, pollMs = CALCULATION_POLL_MS) {
  return useQuery({ ...getCalculationQueryOptions(id ?? 0, pollMs), enabled: id !== null });
}
