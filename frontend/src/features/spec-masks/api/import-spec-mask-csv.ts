import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpecMaskKind } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { SPEC_MASK_LISTS_KEY, type SpecMaskView } from './get-spec-masks';

/** Largest mask file the API takes (bytes). */
export const MAX_MASK_CSV_BYTES = 200_000;

export interface ImportSpecMaskCsvInput {
  name: string;
  customerId: number;
  revision: string;
  kind: SpecMaskKind;
  csv: string;
  notes: string;
}

export function importSpecMaskCsv(input: ImportSpecMaskCsvInput): Promise<SpecMaskView> {
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
