import { screen, waitFor, within } from '@testing-library/react';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf, isInvalid } from '../../../test/queries';
import { renderWithProviders } from '../../../test/render';
import { getUsersQueryOptions } from '../api/get-users';
import { CreateUserDialog } from '../components/create-user-dialog';

// Rules and answers: CreateUserDto of the API contract (e-mail, displayName 1–120 characters,
// role one of admin/engineer/sales/operator, password at least 10 characters; 409 when the
// e-mail is taken).

const NEW_USER = {
  id: 9,
  email: 'petra.lind@larkmoor-optics.example',
  displayName: 'Petra Lind',
  role: 'operator',
  active: true,
  mustChangePassword: false,
  createdAt: '2026-12-01T07:00:00.000Z',
  version: 1,
};

/** The dialog as a page holds it: open until it asks to close. */
function OpenDialog({ onClose }: { onClose: () => void }) {
  const [open, setOpen] = useState(true);
  return (
    <CreateUserDialog
      open={open}
      onClose={() => {
        onClose();
        setOpen(false);
      }}
    />
  );
}

async function fillForm(user: ReturnType<typeof renderWithProviders>['user'], password: string) {
  const dialog = within(await screen.findByRole('dialog', { name: 'New user' }));
  await user.type(dialog.getByLabelText('E-mail'), 'petra.lind@larkmoor-optics.example');
  await user.type(dialog.getByLabelText('Display name'), '  Petra Lind ');
  await user.selectOptions(dialog.getByLabelText('Role'), 'operator');
  await user.type(dialog.getByLabelText('Initial password'), password);
  await user.click(dialog.getByRole('button', { name: 'Create user' }));
  return dialog;
}

describe('CreateUserDialog', () => {
  it('posts e-mail, trimmed display name, role and password, then refreshes the list and closes', async () => {
    const api = mockApi({ 'POST /api/users': { status: 201, body: NEW_USER } });
    const onClose = vi.fn();
    const { user, queryClient } = renderWithProviders(<OpenDialog onClose={onClose} />);
    queryClient.setQueryData(getUsersQueryOptions().queryKey, []);

    await fillForm(user, 'lantern-field-7');

    await waitFor(() => expect(onClose).toHaveBeenCalledTimes(1));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(api.calls('POST', '/api/users').map((r) => r.body)).toEqual([
      {
        email: 'petra.lind@larkmoor-optics.example',
        displayName: 'Petra Lind',
        role: 'operator',
        password: 'lantern-field-7',
      },
    ]);
    expect(queryClient.getQueryState(getUsersQueryOptions().queryKey)?.isInvalidated).toBe(true);
    expect((await screen.findByRole('alert')).textContent).toBe(
      'Account created for petra.lind@larkmoor-optics.example.',
    );
  });

  it('rejects an initial password of 9 characters without calling fetch', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<OpenDialog onClose={() => {}} />);

    await fillForm(user, '123456789');

    await waitFor(() => expect(isInvalid('Initial password')).toBe(true));
    expect(descriptionOf('Initial password')).toBe('At least 10 characters');
    expect(api.fetchMock).not.toHaveBeenCalled();
  });

  it('asks for a role and a valid e-mail before sending', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<OpenDialog onClose={() => {}} />);

    const dialog = within(await screen.findByRole('dialog', { name: 'New user' }));
    await user.type(dialog.getByLabelText('E-mail'), 'petra.lind@');
    await user.type(dialog.getByLabelText('Initial password'), 'lantern-field-7');
    await user.click(dialog.getByRole('button', { name: 'Create user' }));

    await waitFor(() => expect(descriptionOf('Role')).toBe('Choose a role'));
    expect(descriptionOf('E-mail')).toBe('Enter a valid e-mail address');
    expect(descriptionOf('Display name')).toBe('Enter a display name');
    expect(api.fetchMock).not.toHaveBeenCalled();
  });

  it("shows the API's 409 message in the dialog and stays open", async () => {
    mockApi({
      'POST /api/users': apiError(409, 'Conflict', 'A user with this e-mail already exists.'),
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<OpenDialog onClose={onClose} />);

    const dialog = await fillForm(user, 'lantern-field-7');

    expect((await dialog.findByRole('alert')).textContent).toBe('A user with this e-mail already exists.');
    // Only the dialog shows it: no second message in the snackbar.
    expect(screen.getAllByRole('alert')).toHaveLength(1);
    expect(onClose).not.toHaveBeenCalled();
  });
});
