import { screen, within } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it } from 'vitest';
import { HEALTH_OK, STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Expected links: the role table NAV_SECTIONS in shared/src/roles.ts (the API enforces the same
// rules), written out literally here so a change on either side makes this test fail.
const EXPECTED_LINKS: Record<Role, [name: string, href: string][]> = {
  admin: [
    ['Home', '/'],
    ['Stack designs', '/designs'],
    ['Materials', '/materials'],
    ['Customers', '/customers'],
    ['Spec masks', '/spec-masks'],
    ['Compute queue', '/compute-queue'],
    ['Released recipes', '/recipes'],
    ['Chamber runs', '/runs'],
    ['Chambers', '/chambers'],
    ['Compliance reports', '/reports'],
    ['Quotes', '/quotes'],
    ['Outbox', '/admin/outbox'],
    ['Audit trail', '/admin/audit'],
    ['Users', '/admin/users'],
  ],
  engineer: [
    ['Home', '/'],
    ['Stack designs', '/designs'],
    ['Materials', '/materials'],
    ['Customers', '/customers'],
    ['Spec masks', '/spec-masks'],
    ['Compute queue', '/compute-queue'],
    ['Released recipes', '/recipes'],
    ['Chamber runs', '/runs'],
    ['Chambers', '/chambers'],
    ['Compliance reports', '/reports'],
    ['Quotes', '/quotes'],
  ],
  sales: [
    ['Home', '/'],
    ['Stack designs', '/designs'],
    ['Customers', '/customers'],
    ['Spec masks', '/spec-masks'],
    ['Compliance reports', '/reports'],
    ['Quotes', '/quotes'],
  ],
  operator: [
    ['Home', '/'],
    ['Released recipes', '/recipes'],
    ['Chamber runs', '/runs'],
    ['Chambers', '/chambers'],
  ],
};

describe('side navigation', () => {
  it.each(Object.keys(EXPECTED_LINKS) as Role[])(
    'shows exactly the sections of the %s role',
    async (role) => {
      mockApi({
        'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
        'GET /api/health': { status: 200, body: HEALTH_OK },
      });
      renderApp('/');

      const nav = await screen.findByRole('navigation', { name: 'Main' });
      const links = within(nav).getAllByRole('link');

      expect(links.map((link) => [link.textContent, link.getAttribute('href')])).toEqual(
        EXPECTED_LINKS[role],
      );
    },
  );

  it('shows the signed-in user and role in the top bar, and the role sections as cards on Home', async () => {
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.sales } },
      'GET /api/health': { status: 200, body: HEALTH_OK },
    });
    renderApp('/');

    const banner = await screen.findByRole('banner');
    expect(within(banner).getByText('Quietglass')).toBeTruthy();
    expect(within(banner).getByText('Ines Calder')).toBeTruthy();
    expect(within(banner).getByText('Sales')).toBeTruthy();
    expect(screen.getByRole('heading', { level: 1, name: 'Welcome, Ines Calder' })).toBeTruthy();
    const cards = within(screen.getByRole('list', { name: 'Your sections' })).getAllByRole('heading');
    expect(cards.map((h) => h.textContent)).toEqual([
      'Stack designs',
      'Customers',
      'Spec masks',
      'Compliance reports',
      'Quotes',
    ]);
    expect((await screen.findByRole('status', { name: 'Service status' })).textContent).toBe(
      'All services running · Database ok · Redis ok · Queue ok · Worker ok',
    );
  });

  it('marks the current page in the navigation', async () => {
    mockApi({ 'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } } });
    renderApp('/runs');

    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'Chamber runs' }).getAttribute('aria-current')).toBe('page');
    expect(within(nav).getByRole('link', { name: 'Home' }).getAttribute('aria-current')).toBeNull();
  });

  it.each([
    ['/designs', 'Stack designs'],
    ['/materials', 'Materials'],
    ['/customers', 'Customers'],
    ['/spec-masks', 'Spec masks'],
    ['/compute-queue', 'Compute queue'],
    ['/recipes', 'Released recipes'],
    ['/runs', 'Chamber runs'],
    ['/chambers', 'Chambers'],
    ['/reports', 'Compliance reports'],
    ['/quotes', 'Quotes'],
    ['/admin/outbox', 'Outbox'],
    ['/admin/audit', 'Audit trail'],
    ['/admin/users', 'Users'],
  ])('opens the %s page with its title', async (path, title) => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.admin } },
      'GET /api/designs': { status: 200, body: [] },
      'GET /api/materials': { status: 200, body: [] },
      'GET /api/customers': { status: 200, body: [] },
      'GET /api/spec-masks': { status: 200, body: [] },
      'GET /api/calculations': { status: 200, body: [] },
      'GET /api/recipes': { status: 200, body: [] },
      'GET /api/runs': { status: 200, body: [] },
      'GET /api/chambers': { status: 200, body: [] },
      'GET /api/reports': { status: 200, body: [] },
      'GET /api/quotes': { status: 200, body: [] },
      'GET /api/outbox': { status: 200, body: [] },
      'GET /api/audit': { status: 200, body: [] },
      'GET /api/users': { status: 200, body: [] },
      'GET /api/shop-settings': {
        status: 200,
        body: { shopName: 'Larkspur Thin Film Works', logo: null, version: 0, updatedAt: null },
      },
    });
    renderApp(path);

    expect(await screen.findByRole('heading', { level: 1, name: title }, { timeout: 10_000 })).toBeTruthy();
    expect(document.title).toBe(`${title} · Quietglass`);
    expect(api.unexpected.filter((key) => key !== 'GET /api/health')).toEqual([]);
  });
});
