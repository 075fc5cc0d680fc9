import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RunSheetSides, RunSheetView } from '@quietglass/shared';
import { apiClient, apiUrl } from '../../../lib/api-client';

export type { RunSheetView } from '@quietglass/shared';

export interface RunSheetParams {
  designId: number;
  number: number;
  chamberId: number;
  /** One of the chamber's monitor wavelengths; the chamber's first when null. */
  monitorWavelengthNm: number | null;
  /** What the run coats; left out when null (the API then prints blanks and the design's substrate). */
  job?: RunSheetJobParams;
}

export interface RunSheetJobParams {
  part: string | null;
  quantity: number | null;
  sides: RunSheetSides | null;
  substrateThicknessMm: number | null;
}

export const NO_JOB: RunSheetJobParams = {
  part: null,
  quantity: null,
  sides: null,
  substrateThicknessMm: null,
};

function query({ chamberId, monitorWavelengthNm, job = NO_JOB }: RunSheetParams): string {
  const params = new URLSearchParams({ chamberId: String(chamberId) });
  if (monitorWavelengthNm !== null) params.set('monitorWavelengthNm', String(monitorWavelengthNm));
  if (job.part) params.set('part', job.part);
  if (job.quantity !== null) params.set('quantity', String(job.quantity));
  if (job.sides !== null) params.set('sides', job.sides);
  if (job.substrateThicknessMm !== null) params.set('substrateThicknessMm', String(job.substrateThicknessMm));
  return params.toString();
}

export function getRunSheet(params: RunSheetParams, signal?: AbortSignal): Promise<RunSheetView> {
  return apiClient.get<RunSheetView>(
    `/recipes/${params.designId}/${params.number}/run-sheet?${query(params)}`,
    signal,
  );
}

/** Where the browser downloads the same run sheet as a PDF. */
export function runSheetPdfUrl(params: RunSheetParams): string {
  return apiUrl(`/recipes/${params.designId}/${params.number}/run-sheet.pdf?${query(params)}`);
}

export function getRunSheetQueryOptions(params: RunSheetParams) {
  return queryOptions({
    queryKey: [
      'recipes',
      'run-sheet',
      params.designId,
      params.number,
      params.chamberId,
      params.monitorWavelengthNm,
      params.job ?? NO_JOB,
    ] as const,
    queryFn: ({ signal }) => getRunSheet(params, signal),
  });
}

/** The run sheet; nothing is fetched until a chamber is chosen. */
export function useRunSheet(params: RunSheetParams | null) {
  return useQuery({
    ...getRunSheetQueryOptions(params ?? { designId: 0, number: 0, chamberId: 0, monitorWavelengthNm: null }),
    enabled: params !== null,
    placeholderData: keepPreviousData,
  });
}
