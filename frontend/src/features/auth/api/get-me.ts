import { hashKey, queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { UserView } from '@quietglass/shared';
import { ApiError, apiClient } from '../../../lib/api-client';

export interface SessionResponse {
  user: UserView | null;
}

/**
 * The signed-in user, or null when nobody is signed in. The session check answers 200 with
 * `{ user: null }` then, so a visit to the sign-in page logs no failed request; a 401 still means
 * nobody.
 */
export async function getMe(signal?: AbortSignal): Promise<UserView | null> {
  try {
    const { user } = await apiClient.get<SessionResponse>('/auth/session', signal);
    return user;
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export function getMeQueryOptions() {
  return queryOptions({
    queryKey: ['auth', 'me'] as const,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });
}

export function useMe() {
  return useQuery(getMeQueryOptions());
}

/**
 * Starts or ends a session in the cache: drops every cached answer of the previous session and
 * stores the new user (null when signed out).
 */
export function setSessionUser(queryClient: QueryClient, user: UserView | null): void {
  const meKey = getMeQueryOptions().queryKey;
  const meHash = hashKey(meKey);
  queryClient.removeQueries({ predicate: (query) => query.queryHash !== meHash });
  queryClient.setQueryData(meKey, user);
}
