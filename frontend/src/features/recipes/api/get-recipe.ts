import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RecipeView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { RecipeView } from '@quietglass/shared';

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
