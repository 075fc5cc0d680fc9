import { useMutation } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

/** What an n,k file reads as, by the API's own parser; nothing is saved. */
export interface NkCsvPreview {
  table: { wavelengths: number[]; n: number[]; k: number[] };
  unit: 'nm' | 'um';
  decimalComma: boolean;
  headerRow: boolean;
  rangeNm: { from: number; to: number };
}

export interface PreviewMaterialCsvInput {
  csv: string;
  unit?: 'nm' | 'um';
}

export function previewMaterialCsv(input: PreviewMaterialCsvInput): Promise<NkCsvPreview> {
  return apiClient.post<NkCsvPreview>('/materials/import-csv/preview', input);
}

/** Reads an n,k file for the preview; a bad row comes back as 400 with per-row details. */
export function usePreviewMaterialCsv() {
  return useMutation({ mutationFn: previewMaterialCsv, meta: { errorShownInline: true } });
}
