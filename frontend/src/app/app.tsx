import type { QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { RouterProvider } from 'react-router-dom';
import { AppProviders } from './providers';
import type { AppRouter } from './router';
import { connectSession } from './session';

interface AppProps {
  router: AppRouter;
  queryClient: QueryClient;
}

export function App({ router, queryClient }: AppProps) {
  useEffect(() => connectSession(router, queryClient), [router, queryClient]);
  return (
    <AppProviders queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProviders>
  );
}
