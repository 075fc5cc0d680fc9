import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { apiClient } from '../../../lib/api-client';
import { setSessionUser } from './get-me';

export async function signOut(): Promise<void> {
  await apiClient.post<void>('/auth/sign-out');
}

/** Ends the session on the server, forgets the cached user and opens the sign-in page. */
export function useSignOut() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return useMutation({
    mutationFn: signOut,
    onSuccess: async () => {
      // The user is forgotten first, so the sign-in page does not send a signed-in user onwards.
      setSessionUser(queryClient, null);
      await navigate('/sign-in', { replace: true, flushSync: true });
    },
  });
}
