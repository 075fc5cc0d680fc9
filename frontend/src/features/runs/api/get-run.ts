import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { RunView } from './get-runs';

/** A measured spectrum of a run (the file itself is downloaded separately). */
export interface RunSpectrumView {
  id: number;
  runId: number;
  quantity: 'R' | 'T';
  angleDeg: number;
  sample: 'witness' | 'part';
  filename: string;
  wavelengthsNm: number[];
  valuesPercent: number[];
  uploadedBy: string;
  uploadedAt: string;
}

export type RunDetailView = RunView & { spectra: RunSpectrumView[] };

export function getRun(id: number, signal?: AbortSignal): Promise<RunDetailView> {
  return apiClient.get<RunDetailView>(`/runs/${id}`, signal);
}

export function getRunQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['runs', 'detail', id] as const,
    queryFn: ({ signal }) => getRun(id, signal),
  });
}

export function useRun(id: number) {
  return useQuery(getRunQueryOptions(id));
}
