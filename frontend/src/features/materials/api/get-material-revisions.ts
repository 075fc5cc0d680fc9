import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MaterialRevisionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { MaterialRevisionView } from '@quietglass/shared';

/** Earlier revisions of a material, newest first. */
export function getMaterialRevisions(id: number, signal?: AbortSignal): Promise<MaterialRevisionView[]> {
  return apiClient.get<MaterialRevisionView[]>(`/materials/${id}/revisions`, signal);
}

export function getMaterialRevisionsQueryOptions(id: number, revision: number) {
  return queryOptions({
    // The current revision is part of the key: a new revision means one more earlier one.
    queryKey: ['materials', 'detail', id, 'revisions', revision] as const,
    queryFn: ({ signal }) => getMaterialRevisions(id, signal),
  });
}

/** Fetched only when there are earlier revisions (revision > 1). */
export function useMaterialRevisions(id: number, revision: number) {
  return useQuery({ ...getMaterialRevisionsQueryOptions(id, revision), enabled: revision > 1 });
}
