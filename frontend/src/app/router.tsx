import { NAV_SECTIONS, type NavSection } from '@quietglass/shared';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { RequireAuth } from '../features/auth/components/require-auth';
import { AppShell } from './layout/app-shell';
import { RoleGuard } from './layout/role-guard';
import { AccountRoute } from './routes/account-route';
import { HomeRoute } from './routes/home-route';
import { NotFoundRoute } from './routes/not-found-route';
import { LoadingBlock } from '../components/loading-block';
import { RouteError } from './routes/route-error';
import { SectionNotAvailableRoute } from './routes/section-not-available-route';
import { SignInRoute } from './routes/sign-in-route';

export type AppRouter = ReturnType<typeof createBrowserRouter>;

/** The page of a section; pages with the data grid and plots load on first visit. */
function sectionPage(section: NavSection): RouteObject {
  const path = section.path.slice(1);
  switch (section.key) {
    case 'users':
      return { path, lazy: async () => ({ Component: (await import('./routes/users-route')).UsersRoute }) };
    case 'materials':
      return {
        path,
        lazy: async () => ({ Component: (await import('./routes/materials-route')).MaterialsRoute }),
      };
    case 'masks':
      return {
        path,
        lazy: async () => ({ Component: (await import('./routes/spec-masks-route')).SpecMasksRoute }),
      };
    case 'queue':
      return {
        path,
        lazy: async () => ({ Component: (await import('./routes/compute-queue-route')).ComputeQueueRoute }),
      };
    case 'designs':
      return {
        path,
        children: [
          {
            index: true,
            lazy: async () => ({ Component: (await import('./routes/designs-route')).DesignsRoute }),
          },
          {
            path: ':id',
            lazy: async () => ({
              Component: (await import('./routes/design-workspace-route')).DesignWorkspaceRoute,
            }),
          },
        ],
      };
    default:
      return { path, element: <SectionNotAvailableRoute section={section} /> };
  }
}

export const appRoutes: RouteObject[] = [
  {
    errorElement: <RouteError />,
    // Shown while a page loaded on first visit arrives on a fresh page load.
    hydrateFallbackElement: <LoadingBlock label="Loading the page" />,
    children: [
      { path: '/sign-in', element: <SignInRoute /> },
      {
        element: <RequireAuth />,
        children: [
          {
            element: <AppShell />,
            children: [
              {
                errorElement: <RouteError />,
                children: [
                  { index: true, element: <HomeRoute /> },
                  { path: 'account', element: <AccountRoute /> },
                  ...NAV_SECTIONS.map((section) => ({
                    element: <RoleGuard section={section} />,
                    children: [sectionPage(section)],
                  })),
                  { path: '*', element: <NotFoundRoute /> },
                ],
              },
            ],
          },
        ],
      },
    ],
  },
];

export function createAppRouter(): AppRouter {
  return createBrowserRouter(appRoutes);
}
