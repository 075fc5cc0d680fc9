import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getMeQueryOptions } from './get-me';

export interface ChangePasswordInput {
  currentPassword: string;
  newPassword: string;
}

export async function changePassword(input: ChangePasswordInput): Promise<void> {
  await apiClient.post<void>('/auth/password', input);
}

/**
 * Changes the signed-in user's own password. The user is read again: a password an admin set must
 * be replaced before anything else, and this lifts that.
 */
export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey }),
  });
}
