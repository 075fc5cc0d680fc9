import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { getMeQueryOptions } from '../../features/auth/api/get-me';
import { HEALTH_OK, STAFF } from '../../test/fixtures';
import { apiError, mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Session rules: the API contract of the Foundation issue (401 without a signed-in user; the
// session lives in an httpOnly cookie the client never reads).

const meKey = getMeQueryOptions().queryKey;

describe('session', () => {
  it('sends an unauthenticated visitor to sign-in, with the page as next', async () => {
    mockApi({ 'GET /api/auth/session': apiError(401, 'Unauthorized', 'Not signed in.') });
    const { router } = renderApp('/materials');

    // The materials page is loaded on first visit, which takes a while in the test runner.
    expect(await screen.findByRole('button', { name: 'Sign in' }, { timeout: 10_000 })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('?next=%2Fmaterials');
    expect(screen.queryByRole('navigation', { name: 'Main' })).toBeNull();
  });

  it('on a 401 from a data call clears the cached user and opens sign-in; signing in returns to the page', async () => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.admin } },
      'GET /api/users': [
        apiError(401, 'Unauthorized', 'Session expired.'),
        { status: 200, body: [STAFF.admin] },
      ],
      'POST /api/auth/sign-in': { status: 200, body: { user: STAFF.admin } },
    });
    const { router, queryClient, user } = renderApp('/admin/users');

    // The users page is loaded on first visit, which takes a while in the test runner.
    expect(await screen.findByRole('button', { name: 'Sign in' }, { timeout: 10_000 })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('?next=%2Fadmin%2Fusers');
    expect(queryClient.getQueryData(meKey)).toBeNull();
    expect(screen.queryByRole('navigation', { name: 'Main' })).toBeNull();

    await user.type(screen.getByLabelText('E-mail'), STAFF.admin.email);
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { level: 1, name: 'Users' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/admin/users');
    expect(await screen.findByRole('gridcell', { name: STAFF.admin.email })).toBeTruthy();
    expect(api.calls('GET', '/api/users')).toHaveLength(2);
  });

  it('does not follow a next parameter to another site', async () => {
    mockApi({
      'GET /api/auth/session': [apiError(401, 'Unauthorized', 'Not signed in.')],
      'POST /api/auth/sign-in': { status: 200, body: { user: STAFF.sales } },
      'GET /api/health': { status: 200, body: HEALTH_OK },
    });
    const { router, user } = renderApp('/sign-in?next=%2F%2Fevil.example%2F');

    await user.type(await screen.findByLabelText('E-mail'), STAFF.sales.email);
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { level: 1, name: 'Welcome, Ines Calder' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/');
  });

  it('signs out from the account menu', async () => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/health': { status: 200, body: HEALTH_OK },
      'POST /api/auth/sign-out': { status: 204 },
    });
    const { router, queryClient, user } = renderApp('/');

    await user.click(await screen.findByRole('button', { name: 'Account' }));
    await user.click(within(screen.getByRole('menu')).getByRole('menuitem', { name: 'Sign out' }));

    expect(await screen.findByRole('button', { name: 'Sign in' })).toBeTruthy();
    expect(api.calls('POST', '/api/auth/sign-out')).toHaveLength(1);
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe('');
    expect(queryClient.getQueryData(meKey)).toBeNull();
  });

  it('opens the account page from the account menu', async () => {
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/health': { status: 200, body: HEALTH_OK },
    });
    const { router, user } = renderApp('/');

    await user.click(await screen.findByRole('button', { name: 'Account' }));
    await user.click(screen.getByRole('menuitem', { name: 'Change password' }));

    expect(await screen.findByRole('heading', { level: 1, name: 'Account' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/account');
    expect(screen.getByLabelText('Current password')).toBeTruthy();
  });
});
