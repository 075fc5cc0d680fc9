import { useMutation } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

export interface ChangePasswordInput {
  currentPassword: string;
  newPassword: string;
}

export async function changePassword(input: ChangePasswordInput): Promise<void> {
  await apiClient.post<void>('/auth/password', input);
}

/** Changes the signed-in user's own password; nothing cached depends on it. */
export function useChangePassword() {
  return useMutation({ mutationFn: changePassword, meta: { errorShownInline: true } });
}
