import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnalysisQuantity } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type ResultPolarisation = 's' | 'p' | 'avg';

/** One quantity and polarisation of a completed analysis: values[iAngle][iWavelength], fractions. */
export interface CalculationResult {
  wavelengthsNm: number[];
  anglesDeg: number[];
  quantity: AnalysisQuantity;
  polarisation: ResultPolarisation;
  values: number[][];
}

export interface ResultSelection {
  quantity: AnalysisQuantity;
  polarisation: ResultPolarisation;
}

export function getCalculationResult(
  id: number,
  { quantity, polarisation }: ResultSelection,
  signal?: AbortSignal,
): Promise<CalculationResult> {
  return apiClient.get<CalculationResult>(
    `/calculations/${id}/result?quantity=${quantity}&polarisation=${polarisation}`,
    signal,
  );
}

export function getCalculationResultQueryOptions(id: number, selection: ResultSelection) {
  return queryOptions({
    queryKey: ['calculations', 'detail', id, 'result', selection.quantity, selection.polarisation] as const,
    queryFn: ({ signal }) => getCalculationResult(id, selection, signal),
    // A stored result never changes.
    staleTime: Infinity,
  });
}

/** The grid of a completed calculation; fetched only once it has completed. */
export function useCalculationResult(id: number, selection: ResultSelection, enabled: boolean) {
  return useQuery({ ...getCalculationResultQueryOptions(id, selection), enabled });
}
