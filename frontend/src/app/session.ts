import type { QueryClient } from '@tanstack/react-query';
import { setSessionUser } from '../features/auth/api/get-me';
import { SIGN_IN_PATH, signInPathFor } from '../features/auth/next-path';
import { setUnauthorizedHandler } from '../lib/api-client';
import type { AppRouter } from './router';

/**
 * When any call finds the session gone, forget the cached user and everything fetched for them,
 * and open sign-in with the current page as `next`. Returns a function that undoes the wiring.
 */
export function connectSession(router: AppRouter, queryClient: QueryClient): () => void {
  return setUnauthorizedHandler(() => {
    const { pathname, search } = router.state.location;
    if (pathname === SIGN_IN_PATH) return;
    setSessionUser(queryClient, null);
    void router.navigate(signInPathFor(pathname + search), { replace: true });
  });
}
