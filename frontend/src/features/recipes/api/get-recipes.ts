import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

/** A released version: what the chamber operators may build. */
export interface RecipeSummaryView {
  designId: number;
  number: number;
  /** The design's name. */
  name: string;
  customer: string;
  releasedAt: string;
}

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
