import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { App } from '../app/app';
import { AppProviders } from '../app/providers';
import { appRoutes } from '../app/router';
import { createQueryClient } from '../lib/query-client';

/** The whole app at `path`, with a memory router, a fresh cache and the session wiring. */
export function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes, { initialEntries: [path] });
  const user = userEvent.setup();
  const view = render(<App router={router} queryClient={queryClient} />);
  return { ...view, user, router, queryClient };
}

/** One component with the app's providers and a router around it. */
export function renderWithProviders(ui: ReactElement) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter([{ path: '*', element: ui }], { initialEntries: ['/'] });
  const user = userEvent.setup();
  const view = render(
    <AppProviders queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProviders>,
  );
  return { ...view, user, router, queryClient };
}
