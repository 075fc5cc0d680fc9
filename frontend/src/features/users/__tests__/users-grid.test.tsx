import { screen, waitFor, within } from '@testing-library/react';
import type { UserView } from '@quietglass/shared';
import type { UserEvent } from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { UsersGrid } from '../components/users-grid';

// Answers and bodies: the users endpoints of the Foundation issue's API contract
// (GET /api/users → UserView[]; PATCH /api/users/:id with any of displayName, role, active and the
// version the admin saw; 409 with a message when an administrator changes their own account or the
// account changed since).

const ALL = [STAFF.admin, STAFF.engineer, STAFF.sales, STAFF.operator];

function rowOf(email: string): HTMLElement {
  const row = screen.getByRole('gridcell', { name: email }).closest('[role="row"]');
  if (!(row instanceof HTMLElement)) throw new Error(`no row for ${email}`);
  return row;
}

/**
 * The API as a tiny store: PATCH /api/users/:id applies its body at the current version and counts
 * the version up (409 for a stale one); later GETs list the result.
 */
function mockAccounts(id: number) {
  let rows = ALL;
  return mockApi({
    'GET /api/users': () => ({ status: 200, body: rows }),
    [`PATCH /api/users/${id}`]: (request) => {
      const body = request.body as Partial<UserView>;
      const now = rows.find((u) => u.id === id);
      if (!now || body.version !== now.version)
        return apiError(409, 'Conflict', `changed by someone else (now version ${now?.version})`);
      rows = rows.map((u) => (u.id === id ? { ...u, ...body, version: now.version + 1 } : u));
      return { status: 200, body: rows.find((u) => u.id === id) };
    },
  });
}

/** Presses `button` in the confirm dialog titled `title`. */
async function confirmIn(user: UserEvent, title: string, button: string): Promise<void> {
  await user.click(
    within(await screen.findByRole('dialog', { name: title })).getByRole('button', { name: button }),
  );
}

describe('UsersGrid', () => {
  it('shows one row per user from GET /api/users with e-mail, name, role and active flag', async () => {
    mockApi({ 'GET /api/users': { status: 200, body: ALL } });
    renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    expect(await screen.findByRole('gridcell', { name: STAFF.engineer.email })).toBeTruthy();
    const grid = screen.getByRole('grid', { name: 'Users' });
    // One header row plus one row per user.
    expect(within(grid).getAllByRole('row')).toHaveLength(1 + ALL.length);
    expect(
      within(grid)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['E-mail', 'Name', 'Role', 'Active', 'Created', 'Password']);

    for (const account of ALL) {
      const row = within(rowOf(account.email));
      expect(row.getByRole('gridcell', { name: account.displayName })).toBeTruthy();
      expect(
        (row.getByRole('combobox', { name: `Role of ${account.email}` }) as HTMLSelectElement).value,
      ).toBe(account.role);
      expect(
        (row.getByRole('switch', { name: `Active: ${account.email}` }) as HTMLInputElement).checked,
      ).toBe(account.active);
    }
  });

  it("does not offer to change the signed-in administrator's own role or active flag", async () => {
    mockApi({ 'GET /api/users': { status: 200, body: ALL } });
    renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const own = within(await waitFor(() => rowOf(STAFF.admin.email)));
    expect(
      (own.getByRole('combobox', { name: `Role of ${STAFF.admin.email}` }) as HTMLSelectElement).disabled,
    ).toBe(true);
    expect(
      (own.getByRole('switch', { name: `Active: ${STAFF.admin.email}` }) as HTMLInputElement).disabled,
    ).toBe(true);
    const other = within(rowOf(STAFF.sales.email));
    expect(
      (other.getByRole('combobox', { name: `Role of ${STAFF.sales.email}` }) as HTMLSelectElement).disabled,
    ).toBe(false);
  });

  it('changes a role inline with PATCH { role } after confirmation and reports it by name and role', async () => {
    const api = mockApi({
      'GET /api/users': [
        { status: 200, body: ALL },
        { status: 200, body: ALL.map((u) => (u.id === STAFF.engineer.id ? { ...u, role: 'sales' } : u)) },
      ],
      'PATCH /api/users/2': { status: 200, body: { ...STAFF.engineer, role: 'sales' } },
    });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const select = await screen.findByRole('combobox', { name: `Role of ${STAFF.engineer.email}` });
    await user.selectOptions(select, 'sales');
    // Nothing changes until the admin confirms, and the dialog says what the change does.
    const ask = await screen.findByRole('dialog', {
      name: `Change ${STAFF.engineer.displayName}'s role to Sales?`,
    });
    expect(ask.textContent).toContain('Their open sessions end');
    expect(api.calls('PATCH', '/api/users/2')).toHaveLength(0);
    await user.click(within(ask).getByRole('button', { name: 'Make Sales' }));

    const notice = await screen.findByRole('alert');
    expect(
      within(notice).getByText(`${STAFF.engineer.displayName} is now Sales; their sessions have ended.`),
    ).toBeTruthy();
    expect(within(notice).getByRole('button', { name: 'Undo' })).toBeTruthy();
    expect(api.calls('PATCH', '/api/users/2').map((r) => r.body)).toEqual([{ role: 'sales', version: 1 }]);
    await waitFor(() => expect(api.calls('GET', '/api/users')).toHaveLength(2));
    expect((select as HTMLSelectElement).value).toBe('sales');
    expect(api.unexpected).toEqual([]);
  });

  it('a cancelled role change sends nothing and leaves the role as it was', async () => {
    const api = mockApi({ 'GET /api/users': { status: 200, body: ALL } });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const select = await screen.findByRole('combobox', { name: `Role of ${STAFF.engineer.email}` });
    await user.selectOptions(select, 'operator');
    const ask = await screen.findByRole('dialog', {
      name: `Change ${STAFF.engineer.displayName}'s role to Operator?`,
    });
    await user.click(within(ask).getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());

    expect(api.requests.filter((r) => r.method !== 'GET')).toEqual([]);
    expect((select as HTMLSelectElement).value).toBe('engineer');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('Undo after a role change sends the reverse PATCH and the grid shows the old role again', async () => {
    const api = mockAccounts(2);
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const select = await screen.findByRole('combobox', { name: `Role of ${STAFF.engineer.email}` });
    await user.selectOptions(select, 'operator');
    await confirmIn(user, `Change ${STAFF.engineer.displayName}'s role to Operator?`, 'Make Operator');
    await user.click(within(await screen.findByRole('alert')).getByRole('button', { name: 'Undo' }));

    // The undo is a change of its own: no second confirmation, and it is reported without another Undo.
    const undone = await screen.findByText(
      `${STAFF.engineer.displayName} is now Engineer; their sessions have ended.`,
    );
    expect(
      within(undone.closest('[role="alert"]') as HTMLElement).queryByRole('button', { name: 'Undo' }),
    ).toBeNull();
    // The Undo is based on the version the change left (1 → 2), so it applies.
    expect(api.calls('PATCH', '/api/users/2').map((r) => r.body)).toEqual([
      { role: 'operator', version: 1 },
      { role: 'engineer', version: 2 },
    ]);
    await waitFor(() => expect((select as HTMLSelectElement).value).toBe('engineer'));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(api.unexpected).toEqual([]);
  });

  it('Undo after a deactivation reactivates the account with PATCH { active: true }', async () => {
    const api = mockAccounts(3);
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const toggle = await screen.findByRole('switch', { name: `Active: ${STAFF.sales.email}` });
    await user.click(toggle);
    await confirmIn(user, `Deactivate ${STAFF.sales.displayName}?`, 'Deactivate');
    const notice = await screen.findByRole('alert');
    expect(
      within(notice).getByText(`${STAFF.sales.displayName} is deactivated and signed out.`),
    ).toBeTruthy();
    await waitFor(() => expect((toggle as HTMLInputElement).checked).toBe(false));
    await user.click(within(notice).getByRole('button', { name: 'Undo' }));

    expect(await screen.findByText(`${STAFF.sales.displayName} can sign in again.`)).toBeTruthy();
    expect(api.calls('PATCH', '/api/users/3').map((r) => r.body)).toEqual([
      { active: false, version: 1 },
      { active: true, version: 2 },
    ]);
    await waitFor(() => expect((toggle as HTMLInputElement).checked).toBe(true));
  });

  it('a refused Undo shows the API message and keeps the server state', async () => {
    const api = mockApi({
      'GET /api/users': [
        { status: 200, body: ALL },
        { status: 200, body: ALL.map((u) => (u.id === 2 ? { ...u, role: 'sales' } : u)) },
      ],
      'PATCH /api/users/2': [
        { status: 200, body: { ...STAFF.engineer, role: 'sales', version: 2 } },
        apiError(
          409,
          'Conflict',
          `${STAFF.engineer.displayName} was changed by someone else (now version 3); reload the page and apply your change again`,
        ),
      ],
    });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const select = await screen.findByRole('combobox', { name: `Role of ${STAFF.engineer.email}` });
    await user.selectOptions(select, 'sales');
    await confirmIn(user, `Change ${STAFF.engineer.displayName}'s role to Sales?`, 'Make Sales');
    await user.click(within(await screen.findByRole('alert')).getByRole('button', { name: 'Undo' }));

    expect(
      await screen.findByText(
        `${STAFF.engineer.displayName} was changed by someone else (now version 3); reload the page and apply your change again`,
      ),
    ).toBeTruthy();
    expect(api.calls('PATCH', '/api/users/2').map((r) => r.body)).toEqual([
      { role: 'sales', version: 1 },
      { role: 'engineer', version: 2 },
    ]);
    await waitFor(() => expect((select as HTMLSelectElement).value).toBe('sales'));
  });

  it('asks before deactivating, and a cancel sends nothing', async () => {
    const api = mockApi({ 'GET /api/users': { status: 200, body: ALL } });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    await user.click(await screen.findByRole('switch', { name: `Active: ${STAFF.sales.email}` }));
    const ask = await screen.findByRole('dialog', { name: `Deactivate ${STAFF.sales.displayName}?` });
    expect(ask.textContent).toContain('signed out everywhere at once');
    await user.click(within(ask).getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(api.calls('PATCH', '/api/users/3')).toHaveLength(0);
    expect(
      (screen.getByRole('switch', { name: `Active: ${STAFF.sales.email}` }) as HTMLInputElement).checked,
    ).toBe(true);
  });

  it('deactivates with PATCH { active: false } and shows a 409 message, keeping the server state', async () => {
    const api = mockApi({
      'GET /api/users': { status: 200, body: ALL },
      'PATCH /api/users/3': apiError(409, 'Conflict', 'At least one active administrator must remain.'),
    });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    const toggle = await screen.findByRole('switch', { name: `Active: ${STAFF.sales.email}` });
    await user.click(toggle);
    await confirmIn(user, `Deactivate ${STAFF.sales.displayName}?`, 'Deactivate');

    expect((await screen.findByRole('alert')).textContent).toBe(
      'At least one active administrator must remain.',
    );
    expect(api.calls('PATCH', '/api/users/3').map((r) => r.body)).toEqual([{ active: false, version: 1 }]);
    await waitFor(() =>
      expect(
        (screen.getByRole('switch', { name: `Active: ${STAFF.sales.email}` }) as HTMLInputElement).checked,
      ).toBe(true),
    );
  });

  it('resets a password with POST /api/users/:id/password and rejects a short one locally', async () => {
    const api = mockApi({
      'GET /api/users': { status: 200, body: ALL },
      'POST /api/users/4/password': { status: 204 },
    });
    const { user } = renderWithProviders(<UsersGrid currentUserId={STAFF.admin.id} />);

    await user.click(
      await screen.findByRole('button', { name: `Reset password of ${STAFF.operator.email}` }),
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'Reset password' }));
    await user.type(dialog.getByLabelText('New password'), 'short');
    await user.click(dialog.getByRole('button', { name: 'Set password' }));
    expect(dialog.getByLabelText('New password').getAttribute('aria-invalid')).toBe('true');
    expect(api.calls('POST', '/api/users/4/password')).toHaveLength(0);

    await user.type(dialog.getByLabelText('New password'), '-and-longer');
    await user.click(dialog.getByRole('button', { name: 'Set password' }));

    // No Undo: the user's sessions have already ended, so a reset cannot be taken back.
    const notice = await screen.findByRole('alert');
    expect(notice.textContent).toBe(`New password set for ${STAFF.operator.email}.`);
    expect(within(notice).queryByRole('button', { name: 'Undo' })).toBeNull();
    expect(api.calls('POST', '/api/users/4/password').map((r) => r.body)).toEqual([
      { newPassword: 'short-and-longer' },
    ]);
  });
});
