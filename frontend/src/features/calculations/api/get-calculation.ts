import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnalysisRequest, AnalysisSummary } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type CalculationStatus = 'queued' | 'running' | 'completed' | 'failed' | 'cancelled';

/** What a job of the compute queue does: a full analysis, or one of the optimisations. */
export type CalculationKind = 'analysis' | 'fit' | 'grow' | 'yield' | 'diagnosis';

/** A job of the compute queue and, once done, the summary of its result. */
export interface CalculationView {
  id: number;
  kind: CalculationKind;
  status: CalculationStatus;
  /** 0 to 1. */
  progress: number;
  error: string | null;
  designId: number | null;
  versionNumber: number | null;
  /** An analysis's grid (AnalysisRequest), or an optimisation's options. */
  request: unknown;
  /** An analysis's AnalysisSummary, or an optimisation's result. */
  summary: AnalysisSummary | Record<string, unknown> | null;
  /** Merit history streamed while an optimisation runs. */
  live: { history: { iteration?: number; layerCount?: number; merit: number }[] } | null;
  /** The chamber run a diagnosis belongs to. */
  runId: number | null;
  createdBy: string;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  computeMs: number | null;
  processedBy: string | null;
  attempts: number;
}

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
