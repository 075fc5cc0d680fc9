import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SpectrumComparisonView } from '@quietglass/shared';
import { apiClient, apiUrl } from '../../../lib/api-client';

export type { SpectrumComparisonView } from '@quietglass/shared';

export function getSpectrumComparison(
  runId: number,
  spectrumId: number,
  signal?: AbortSignal,
): Promise<SpectrumComparisonView> {
  return apiClient.get<SpectrumComparisonView>(`/runs/${runId}/spectra/${spectrumId}/comparison`, signal);
}

export function getSpectrumComparisonQueryOptions(runId: number, spectrumId: number) {
  return queryOptions({
    queryKey: ['runs', 'detail', runId, 'spectra', spectrumId, 'comparison'] as const,
    queryFn: ({ signal }) => getSpectrumComparison(runId, spectrumId, signal),
  });
}

export function useSpectrumComparison(runId: number, spectrumId: number) {
  return useQuery(getSpectrumComparisonQueryOptions(runId, spectrumId));
}

/** Where the browser downloads the spectrum file exactly as it was uploaded. */
export function originalSpectrumUrl(runId: number, spectrumId: number): string {
  return apiUrl(`/runs/${runId}/spectra/${spectrumId}/original`);
}
