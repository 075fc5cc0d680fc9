import type { ComponentType } from 'react';
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
import { SignInRoute } from './routes/sign-in-route';

export type AppRouter = ReturnType<typeof createBrowserRouter>;

type PageLoader = () => Promise<ComponentType>;

/** A page of a section, loaded on first visit (the pages with the data grid and plots are large). */
function page(load: PageLoader): Pick<RouteObject, 'lazy'> {
  return { lazy: async () => ({ Component: await load() }) };
}

/** Each section's index page and the pages below it (`:id` and the like), relative to its path. */
const SECTION_PAGES: Record<NavSection['key'], { path?: string; load: PageLoader }[]> = {
  users: [{ load: async () => (await import('./routes/users-route')).UsersRoute }],
  materials: [{ load: async () => (await import('./routes/materials-route')).MaterialsRoute }],
  customers: [{ load: async () => (await import('./routes/customers-route')).CustomersRoute }],
  masks: [{ load: async () => (await import('./routes/spec-masks-route')).SpecMasksRoute }],
  queue: [{ load: async () => (await import('./routes/compute-queue-route')).ComputeQueueRoute }],
  designs: [
    { load: async () => (await import('./routes/designs-route')).DesignsRoute },
    { path: ':id', load: async () => (await import('./routes/design-workspace-route')).DesignWorkspaceRoute },
  ],
  recipes: [
    { load: async () => (await import('./routes/recipes-route')).RecipesRoute },
    { path: ':designId/:number', load: async () => (await import('./routes/run-sheet-route')).RunSheetRoute },
  ],
  runs: [
    { load: async () => (await import('./routes/runs-route')).RunsRoute },
    { path: ':id', load: async () => (await import('./routes/run-route')).RunRoute },
  ],
  chambers: [{ load: async () => (await import('./routes/chambers-route')).ChambersRoute }],
  reports: [
    { load: async () => (await import('./routes/reports-route')).ReportsRoute },
    { path: ':id', load: async () => (await import('./routes/report-route')).ReportRoute },
  ],
  quotes: [
    { load: async () => (await import('./routes/quotes-route')).QuotesRoute },
    { path: ':id', load: async () => (await import('./routes/quote-route')).QuoteRoute },
  ],
  outbox: [{ load: async () => (await import('./routes/outbox-route')).OutboxRoute }],
  audit: [{ load: async () => (await import('./routes/audit-route')).AuditRoute }],
};

function sectionPage(section: NavSection): RouteObject {
  const pages = SECTION_PAGES[section.key];
  return {
    path: section.path.slice(1),
    children: pages.map(({ path, load }) =>
      path ? { path, ...page(load) } : { index: true, ...page(load) },
    ),
  };
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
