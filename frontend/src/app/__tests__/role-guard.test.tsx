import { screen } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Which role may open which section: NAV_SECTIONS in shared/src/roles.ts.

function signedInAs(role: Role, extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({ 'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } }, ...extra });
}

describe('role guard', () => {
  it.each([
    ['sales', '/materials', 'Materials', 'Sales'],
    ['operator', '/designs', 'Stack designs', 'Operator'],
    ['operator', '/quotes', 'Quotes', 'Operator'],
  ] as const)('refuses %s on %s instead of showing the section', async (role, path, label, roleLabel) => {
    signedInAs(role);
    renderApp(path);

    // The section's page (with the data grid) is loaded on first visit, which takes a while here.
    expect(
      await screen.findByRole(
        'heading',
        { level: 1, name: 'Not permitted for your role' },
        { timeout: 10_000 },
      ),
    ).toBeTruthy();
    expect(
      screen.getByText(
        `${label} is not open to the ${roleLabel} role (403). Ask an administrator if your work needs it.`,
      ),
    ).toBeTruthy();
    expect(screen.queryByText(`${label} is not available yet in this release.`)).toBeNull();
  });

  it('refuses the users page to an operator without asking the API for the users', async () => {
    const api = signedInAs('operator');
    renderApp('/admin/users');

    expect(
      await screen.findByRole(
        'heading',
        { level: 1, name: 'Not permitted for your role' },
        { timeout: 10_000 },
      ),
    ).toBeTruthy();
    expect(screen.queryByRole('grid')).toBeNull();
    expect(api.calls('GET', '/api/users')).toHaveLength(0);
  });

  it('lets a permitted role through to the section page', async () => {
    const api = signedInAs('sales', {
      'GET /api/quotes': { status: 200, body: [] },
      'GET /api/customers': { status: 200, body: [] },
      'GET /api/designs': { status: 200, body: [] },
      'GET /api/spec-masks': { status: 200, body: [] },
    });
    renderApp('/quotes');

    expect(await screen.findByRole('heading', { level: 1, name: 'Quotes' })).toBeTruthy();
    expect(await screen.findByRole('grid', { name: 'Quotes' })).toBeTruthy();
    expect(await screen.findByText('No quotes yet')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'New quote' })).toBeTruthy();
    expect(screen.queryByText('Quotes is not available yet in this release.')).toBeNull();
    expect(screen.queryByText('Not permitted for your role')).toBeNull();
    expect(api.calls('GET', '/api/quotes')).toHaveLength(1);
  });

  it('shows "Page not found" for an address that is no page', async () => {
    signedInAs('admin');
    renderApp('/no-such-page');

    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeTruthy();
  });
});
