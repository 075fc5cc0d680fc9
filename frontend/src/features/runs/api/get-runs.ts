import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

export type DurabilityTest = 'adhesion' | 'abrasion' | 'humidity' | 'other';

/** What the monitor showed for one deposition step (1 = next to the substrate). */
export interface LayerReading {
  step: number;
  monitorThicknessNm?: number;
  rateNmPerS?: number;
  notes?: string;
}

/** One durability test of the run's witness or part, with the procedure followed. */
export interface DurabilityResult {
  test: DurabilityTest;
  method: string;
  result: 'pass' | 'fail';
  notes?: string;
}

/** A chamber run of a released recipe. */
export interface RunView {
  id: number;
  designId: number;
  versionNumber: number;
  chamberId: number;
  lotNumber: string;
  /** YYYY-MM-DD. */
  runDate: string;
  operator: { id: number; displayName: string };
  layerReadings: LayerReading[];
  durability: DurabilityResult[];
  notes: string;
  createdAt: string;
  updatedAt: string;
}

/** The latest runs, newest first. */
export function getRuns(signal?: AbortSignal): Promise<RunView[]> {
  return apiClient.get<RunView[]>('/runs', signal);
}

export function getRunsQueryOptions() {
  return queryOptions({
    queryKey: ['runs', 'list'] as const,
    queryFn: ({ signal }) => getRuns(signal),
  });
}

export function useRuns() {
  return useQuery(getRunsQueryOptions());
}
