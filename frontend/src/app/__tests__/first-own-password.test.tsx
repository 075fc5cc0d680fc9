import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Flow: a user whose password an admin set (mustChangePassword in UserView) sees only the
// password change until they have chosen their own; the API holds every other route meanwhile.

describe('first sign-in after an admin set the password', () => {
  it('shows only "Choose your own password" and, once changed, the page that was asked for', async () => {
    const held = { ...STAFF.engineer, mustChangePassword: true };
    const api = mockApi({
      'GET /api/auth/session': [
        { status: 200, body: { user: held } },
        { status: 200, body: { user: STAFF.engineer } },
      ],
      'POST /api/auth/password': { status: 204 },
      'GET /api/designs': { status: 200, body: [] },
      'GET /api/customers': { status: 200, body: [] },
      'GET /api/materials': { status: 200, body: [] },
      'GET /api/spec-masks': { status: 200, body: [] },
    });
    const { user } = renderApp('/designs');

    expect(await screen.findByRole('heading', { name: 'Choose your own password' })).toBeTruthy();
    expect(api.calls('GET', '/api/designs')).toHaveLength(0);
    await user.type(screen.getByLabelText('Current password'), 'admin-set-password');
    await user.type(screen.getByLabelText('New password'), 'my-own-password-1');
    await user.type(screen.getByLabelText('Repeat new password'), 'my-own-password-1');
    await user.click(screen.getByRole('button', { name: /change password/i }));

    expect(api.calls('POST', '/api/auth/password').map((r) => r.body)).toEqual([
      { currentPassword: 'admin-set-password', newPassword: 'my-own-password-1' },
    ]);
    await screen.findByRole('heading', { level: 1, name: /stack designs/i }, { timeout: 10_000 });
    expect(screen.queryByRole('heading', { name: 'Choose your own password' })).toBeNull();
  });
});
