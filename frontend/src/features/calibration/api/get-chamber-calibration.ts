import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChamberCalibrationView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type {
  CalibrationRunPoint,
  CalibrationSeriesView,
  CalibrationSuggestionView,
  ChamberCalibrationView,
} from '@quietglass/shared';

/** A chamber's calibration history, estimates, pending suggestions and past decisions. */
export function getChamberCalibration(
  chamberId: number,
  signal?: AbortSignal,
): Promise<ChamberCalibrationView> {
  return apiClient.get<ChamberCalibrationView>(`/chambers/${chamberId}/calibration`, signal);
}

export function getChamberCalibrationQueryOptions(chamberId: number) {
  return queryOptions({
    queryKey: ['chambers', chamberId, 'calibration'] as const,
    queryFn: ({ signal }) => getChamberCalibration(chamberId, signal),
  });
}

export function useChamberCalibration(chamberId: number | null) {
  return useQuery({ ...getChamberCalibrationQueryOptions(chamberId ?? 0), enabled: chamberId !== null });
}
