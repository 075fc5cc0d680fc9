import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReportView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { ReportBandRow, ReportSummary, ReportView } from '@quietglass/shared';

export interface ReportFilter {
  /** Only reports of this design; every report when omitted. */
  designId?: number;
}

export function getReports(filter: ReportFilter, signal?: AbortSignal): Promise<ReportView[]> {
  const query = filter.designId === undefined ? '' : `?designId=${filter.designId}`;
  return apiClient.get<ReportView[]>(`/reports${query}`, signal);
}

/** Prefix of every report list's query key, for invalidation. */
export const REPORT_LISTS_KEY = ['reports', 'list'] as const;

export function getReportsQueryOptions(filter: ReportFilter = {}) {
  return queryOptions({
    queryKey: [...REPORT_LISTS_KEY, { designId: filter.designId ?? null }] as const,
    queryFn: ({ signal }) => getReports(filter, signal),
  });
}

export function useReports(filter: ReportFilter = {}, options: { enabled?: boolean } = {}) {
  return useQuery({ ...getReportsQueryOptions(filter), enabled: options.enabled ?? true });
}
