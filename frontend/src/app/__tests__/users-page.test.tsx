import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Flow: an administrator creates an account (POST /api/users → 201 UserView, contract of the
// Foundation issue) and the list is read again from GET /api/users.

const PETRA = {
  id: 9,
  email: 'petra.lind@larkmoor-optics.example',
  displayName: 'Petra Lind',
  role: 'sales' as const,
  active: true,
  mustChangePassword: false,
  createdAt: '2026-12-01T07:00:00.000Z',
  version: 1,
};

describe('users page', () => {
  it('creates a user from the "New user" dialog and shows the new row from the refreshed list', async () => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.admin } },
      'GET /api/shop-settings': {
        status: 200,
        body: { shopName: 'Larkspur Thin Film Works', logo: null, version: 0, updatedAt: null },
      },
      'GET /api/users': [
        { status: 200, body: [STAFF.admin, STAFF.engineer] },
        { status: 200, body: [STAFF.admin, STAFF.engineer, PETRA] },
      ],
      'POST /api/users': { status: 201, body: PETRA },
    });
    const { user } = renderApp('/admin/users');

    expect(
      await screen.findByRole('gridcell', { name: STAFF.engineer.email }, { timeout: 10_000 }),
    ).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'New user' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'New user' }));
    await user.type(dialog.getByLabelText('E-mail'), PETRA.email);
    await user.type(dialog.getByLabelText('Display name'), PETRA.displayName);
    await user.selectOptions(dialog.getByLabelText('Role'), 'sales');
    await user.type(dialog.getByLabelText('Initial password'), 'lantern-field-7');
    await user.click(dialog.getByRole('button', { name: 'Create user' }));

    expect(await screen.findByRole('gridcell', { name: PETRA.email })).toBeTruthy();
    expect(api.calls('POST', '/api/users').map((r) => r.body)).toEqual([
      { email: PETRA.email, displayName: PETRA.displayName, role: 'sales', password: 'lantern-field-7' },
    ]);
    expect(api.calls('GET', '/api/users')).toHaveLength(2);
    expect(api.unexpected).toEqual([]);
  });
});
