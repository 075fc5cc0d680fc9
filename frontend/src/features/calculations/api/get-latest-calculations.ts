import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CalculationView, LatestCalculations } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** The latest completed result of each kind (analysis, fit, grow, yield) of a design version. */
export function getLatestCalculations(
  designId: number,
  versionNumber: number,
  signal?: AbortSignal,
): Promise<LatestCalculations> {
  return apiClient.get<LatestCalculations>(
    `/designs/${designId}/versions/${versionNumber}/calculations/latest`,
    signal,
  );
}

export function getLatestCalculationsQueryOptions(designId: number, versionNumber: number) {
  return queryOptions({
    queryKey: ['calculations', 'latest', designId, versionNumber] as const,
    queryFn: ({ signal }) => getLatestCalculations(designId, versionNumber, signal),
    staleTime: 0,
    retry: false,
  });
}

export function useLatestCalculations(designId: number, versionNumber: number, enabled = true) {
  return useQuery({ ...getLatestCalculationsQueryOptions(designId, versionNumber), enabled });
}

/** The latest completed Run diagnosis of a chamber run. */
export function getLatestDiagnosis(
  runId: number,
  signal?: AbortSignal,
): Promise<{ calculation: CalculationView | null }> {
  return apiClient.get<{ calculation: CalculationView | null }>(`/runs/${runId}/diagnosis/latest`, signal);
}

export function useLatestDiagnosis(runId: number) {
  return useQuery({
    queryKey: ['calculations', 'latest-diagnosis', runId] as const,
    queryFn: ({ signal }) => getLatestDiagnosis(runId, signal),
    staleTime: 0,
    retry: false,
  });
}
