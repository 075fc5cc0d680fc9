import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

/** One limit band of a compliance report's summary: the worst point against its rule. */
export interface ReportBandRow {
  band: number;
  label: string;
  rule: string;
  angles: string;
  polarisation: string;
  evaluated: boolean;
  pass: boolean | null;
  /** Percentage points inside (+) or outside (−) the limit at the worst point. */
  worstMargin: number | null;
  worstAtNm: number | null;
  valuePercent: number | null;
  /** Why a band was not evaluated (measured spectra cover one angle and quantity). */
  reason?: string;
}

export interface ReportSummary {
  source: 'designed' | 'measured';
  pass: boolean | null;
  worstMargin: number | null;
  bands: ReportBandRow[];
  colour: { L: number; a: number; b: number; Rv: number } | null;
}

/** A spec-compliance report as the API returns it (the PDF is fetched on its own). */
export interface ReportView {
  id: number;
  designId: number;
  versionNumber: number;
  specMaskId: number;
  hideLayers: boolean;
  runId: number | null;
  spectrumId: number | null;
  summary: ReportSummary;
  createdBy: string;
  createdAt: string;
}

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
