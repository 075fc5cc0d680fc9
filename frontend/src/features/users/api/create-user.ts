import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role, UserView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getUsersQueryOptions } from './get-users';

export interface CreateUserInput {
  email: string;
  displayName: string;
  role: Role;
  password: string;
}

export function createUser(input: CreateUserInput): Promise<UserView> {
  return apiClient.post<UserView>('/users', input);
}

/** Creates an account; the dialog shows a 409 (e-mail taken) itself. */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getUsersQueryOptions().queryKey }),
  });
}
