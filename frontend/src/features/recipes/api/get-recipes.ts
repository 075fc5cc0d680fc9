import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RecipeSummaryView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { RecipeSummaryView } from '@quietglass/shared';

/** Released recipes, most recently released first. */
export function getRecipes(signal?: AbortSignal): Promise<RecipeSummaryView[]> {
  return apiClient.get<RecipeSummaryView[]>('/recipes', signal);
}

export function getRecipesQueryOptions() {
  return queryOptions({
    queryKey: ['recipes', 'list'] as const,
    queryFn: ({ signal }) => getRecipes(signal),
  });
}

export function useRecipes() {
  return useQuery(getRecipesQueryOptions());
}
