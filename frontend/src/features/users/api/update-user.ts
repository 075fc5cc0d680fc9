import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserInput as UserChanges, UserView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getUsersQueryOptions } from './get-users';

export type { UserChanges };

export interface UpdateUserInput {
  id: number;
  changes: UserChanges;
}

export function updateUser({ id, changes }: UpdateUserInput): Promise<UserView> {
  return apiClient.patch<UserView>(`/users/${id}`, changes);
}

/**
 * Changes name, role or active flag of the account at the version the admin saw (409 if another
 * admin changed it since). The list shows the change at once and falls back to the
 * server's data if it is refused (the refusal, e.g. a 409 for your own account, goes to the snackbar).
 */
export function useUpdateUser() {
  const queryClient = useQueryClient();
  const { queryKey } = getUsersQueryOptions();
  return useMutation({
    mutationFn: updateUser,
    onMutate: async ({ id, changes }) => {
      await queryClient.cancelQueries({ queryKey });
      const previous = queryClient.getQueryData(queryKey);
      queryClient.setQueryData(queryKey, (users) =>
        users?.map((u) => (u.id === id ? { ...u, ...changes } : u)),
      );
      return { previous };
    },
    onError: (_error, _input, context) => {
      if (context?.previous) queryClient.setQueryData(queryKey, context.previous);
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey }),
  });
}
