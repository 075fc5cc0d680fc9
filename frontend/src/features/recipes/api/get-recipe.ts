import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** A released version with its design's name; anything not released is 404. */
export type RecipeView = DesignVersionView & { name: string };

export function getRecipe(designId: number, number: number, signal?: AbortSignal): Promise<RecipeView> {
  return apiClient.get<RecipeView>(`/recipes/${designId}/${number}`, signal);
}

export function getRecipeQueryOptions(designId: number, number: number) {
  return queryOptions({
    queryKey: ['recipes', 'detail', designId, number] as const,
    queryFn: ({ signal }) => getRecipe(designId, number, signal),
  });
}

/** A released recipe; nothing is fetched while either number is null (not known yet). */
export function useRecipe(designId: number | null, number: number | null) {
  return useQuery({
    ...getRecipeQueryOptions(designId ?? 0, number ?? 0),
    enabled: designId !== null && number !== null,
  });
}
