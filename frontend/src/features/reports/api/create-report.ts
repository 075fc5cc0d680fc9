import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateReportInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { REPORT_LISTS_KEY, type ReportView } from './get-reports';

/** An approved or released version against a mask of the design's customer. */
export function createReport(input: CreateReportInput): Promise<ReportView> {
  return apiClient.post<ReportView>('/reports', input);
}

/** Computes and stores a report; the dialog shows errors itself. */
export function useCreateReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createReport,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: REPORT_LISTS_KEY }),
  });
}
