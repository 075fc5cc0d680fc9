import { useMutation } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

export interface ResetPasswordInput {
  id: number;
  newPassword: string;
}

export async function resetPassword({ id, newPassword }: ResetPasswordInput): Promise<void> {
  await apiClient.post<void>(`/users/${id}/password`, { newPassword });
}

/** Sets a new password for another user's account; the dialog shows errors itself. */
export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword, meta: { errorShownInline: true } });
}
