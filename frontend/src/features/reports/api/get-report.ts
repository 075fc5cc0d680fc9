import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient, apiUrl } from '../../../lib/api-client';
import type { ReportView } from './get-reports';

export function getReport(id: number, signal?: AbortSignal): Promise<ReportView> {
  return apiClient.get<ReportView>(`/reports/${id}`, signal);
}

export function getReportQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['reports', 'detail', id] as const,
    queryFn: ({ signal }) => getReport(id, signal),
  });
}

export function useReport(id: number) {
  return useQuery(getReportQueryOptions(id));
}

/** Where the browser fetches a report's PDF (served inline, so it previews and downloads). */
export function reportPdfUrl(id: number): string {
  return apiUrl(`/reports/${id}/pdf`);
}
