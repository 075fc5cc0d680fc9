import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getDesignQueryOptions } from './get-design';
import { getDesignsQueryOptions } from './get-designs';

/** One version's content: header fields, layers, status and the row version to save against. */
export function getDesignVersion(
  designId: number,
  number: number,
  signal?: AbortSignal,
): Promise<DesignVersionView> {
  return apiClient.get<DesignVersionView>(`/designs/${designId}/versions/${number}`, signal);
}

export function getDesignVersionQueryOptions(designId: number, number: number) {
  return queryOptions({
    queryKey: ['designs', 'detail', designId, 'versions', number] as const,
    queryFn: ({ signal }) => getDesignVersion(designId, number, signal),
  });
}

/** A version of a design; nothing is fetched while `number` is null (not chosen yet). */
export function useDesignVersion(designId: number, number: number | null) {
  return useQuery({ ...getDesignVersionQueryOptions(designId, number ?? 0), enabled: number !== null });
}

/**
 * After a version was saved, started or submitted: caches the answer and refreshes its design's
 * version list and the designs list (latest version and status).
 */
export async function storeDesignVersion(queryClient: QueryClient, view: DesignVersionView): Promise<void> {
  queryClient.setQueryData(getDesignVersionQueryOptions(view.designId, view.number).queryKey, view);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: getDesignQueryOptions(view.designId).queryKey, exact: true }),
    queryClient.invalidateQueries({ queryKey: getDesignsQueryOptions().queryKey }),
  ]);
}
