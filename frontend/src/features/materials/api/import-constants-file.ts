import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getMaterialsQueryOptions, type MaterialView } from './get-materials';

export interface ImportConstantsFileInput {
  name: string;
  /** The published optical-constants file's text (YAML with its reference). */
  text: string;
  fileName: string;
  /** Outside the stated range: hold the end values and warn (otherwise refuse). */
  clamp: boolean;
  notes?: string;
}

export function importConstantsFile(input: ImportConstantsFileInput): Promise<MaterialView> {
  return apiClient.post<MaterialView>('/materials/import-constants', input);
}

/** A material from a published constants file, its reference as provenance; the file is kept. */
export function useImportConstantsFile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importConstantsFile,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMaterialsQueryOptions().queryKey }),
  });
}
