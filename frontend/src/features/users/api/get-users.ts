import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UserView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** Every user account (admin only). */
export function getUsers(signal?: AbortSignal): Promise<UserView[]> {
  return apiClient.get<UserView[]>('/users', signal);
}

export function getUsersQueryOptions() {
  return queryOptions({
    queryKey: ['users', 'list'] as const,
    queryFn: ({ signal }) => getUsers(signal),
  });
}

export function useUsers() {
  return useQuery(getUsersQueryOptions());
}
