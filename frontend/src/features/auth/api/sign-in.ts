import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UserView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { setSessionUser } from './get-me';

export interface SignInInput {
  email: string;
  password: string;
}

export async function signIn(input: SignInInput): Promise<UserView> {
  const { user } = await apiClient.post<{ user: UserView }>('/auth/sign-in', {
    email: input.email.trim(),
    password: input.password,
  });
  return user;
}

/** Signs in; on success the user is stored as the session's `me`. The form shows errors itself. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    meta: { errorShownInline: true },
    onSuccess: (user) => setSessionUser(queryClient, user),
  });
}
