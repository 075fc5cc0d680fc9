import { MutationCache, QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';
import { notify } from './notifier';

declare module '@tanstack/react-query' {
  interface Register {
    defaultError: Error;
    mutationMeta: {
      /** The form shows the error itself, so no snackbar is raised. */
      errorShownInline?: boolean;
    };
  }
}

function isClientError(error: unknown): boolean {
  return error instanceof ApiError && error.status >= 400 && error.status < 500;
}

/** One query client per page load (and per test): API errors of mutations go to the snackbar. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // A 4xx answer will not change on retry; network and server failures may.
        retry: (failureCount, error) => !isClientError(error) && failureCount < 2,
      },
      mutations: { retry: false },
    },
    mutationCache: new MutationCache({
      onError: (error, _variables, _context, mutation) => {
        if (mutation.meta?.errorShownInline) return;
        // A 401 sends the user to sign-in, which says enough.
        if (error instanceof ApiError && error.status === 401) return;
        notify(error.message, 'error');
      },
    }),
  });
}
