import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UploadSpectrumInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getRunQueryOptions, type RunSpectrumView } from './get-run';

export function uploadSpectrum(runId: number, input: UploadSpectrumInput): Promise<RunSpectrumView> {
  return apiClient.post<RunSpectrumView>(`/runs/${runId}/spectra`, input);
}

/**
 * Stores a measured spectrum (the file's text with `wavelength_nm` and `R_percent` or `T_percent`
 * columns); a bad row rejects the whole file (400 with one detail per bad row).
 */
export function useUploadSpectrum(runId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UploadSpectrumInput) => uploadSpectrum(runId, input),
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getRunQueryOptions(runId).queryKey }),
  });
}
