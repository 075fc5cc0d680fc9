import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { MaterialInput } from './create-material';
import { getMaterialsQueryOptions, type MaterialView } from './get-materials';

export interface ImportMaterialCsvInput {
  name: string;
  /** The file's text: wavelength, n and optionally k per row. */
  csv: string;
  /** Left out when the header names the unit ("Wavelength (nm)"). */
  unit?: 'nm' | 'um';
  interpolation: 'linear' | 'pchip';
  /** Outside the table: hold the end values and warn. */
  clamp: boolean;
  /** The uploaded file's name, kept with it for download. */
  fileName: string;
  typical: boolean;
  provenance: MaterialInput['provenance'];
}

export function importMaterialCsv(input: ImportMaterialCsvInput): Promise<MaterialView> {
  return apiClient.post<MaterialView>('/materials/import-csv', input);
}

/** Creates a tabulated material from an n,k file; a bad row rejects the whole file (400, per-row details). */
export function useImportMaterialCsv() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importMaterialCsv,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMaterialsQueryOptions().queryKey }),
  });
}
