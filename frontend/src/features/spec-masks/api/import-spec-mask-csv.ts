import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpecMaskCsvImport } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { SPEC_MASK_LISTS_KEY, type SpecMaskView } from './get-spec-masks';

export function importSpecMaskCsv(input: SpecMaskCsvImport): Promise<SpecMaskView> {
  return apiClient.post<SpecMaskView>('/spec-masks/import-csv', input);
}

/** A new mask from a CSV file; errors name the file's rows. */
export function useImportSpecMaskCsv() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importSpecMaskCsv,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: SPEC_MASK_LISTS_KEY }),
  });
}
