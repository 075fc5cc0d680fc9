import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf, isInvalid } from '../../../test/queries';
import { renderWithProviders } from '../../../test/render';
import { ChangePasswordForm } from '../components/change-password-form';

// Rules: the change-password DTO of the Foundation issue (newPassword at least 10 characters;
// wrong current password answers 400 with a message); the repeat field is the form's own check.

async function fill(
  user: ReturnType<typeof renderWithProviders>['user'],
  current: string,
  next: string,
  repeat: string,
) {
  await user.type(screen.getByLabelText('Current password'), current);
  await user.type(screen.getByLabelText('New password'), next);
  await user.type(screen.getByLabelText('Repeat new password'), repeat);
  await user.click(screen.getByRole('button', { name: 'Change password' }));
}

describe('ChangePasswordForm', () => {
  it('rejects a repeat that does not match, without calling the API', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<ChangePasswordForm />);

    await fill(user, 'old password 1', 'quartz-window-42', 'quartz-window-43');

    expect(await screen.findByText('The passwords do not match')).toBeTruthy();
    expect(descriptionOf('Repeat new password')).toBe('The passwords do not match');
    expect(isInvalid('Repeat new password')).toBe(true);
    expect(isInvalid('New password')).toBe(false);
    expect(api.requests).toHaveLength(0);
  });

  it('rejects a new password of 9 characters', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<ChangePasswordForm />);
    await user.type(screen.getByLabelText('Current password'), 'old password 1');
    await user.type(screen.getByLabelText('New password'), '123456789');
    await user.type(screen.getByLabelText('Repeat new password'), '123456789');

    // The helper text already reads "At least 10 characters"; the field turns invalid only on submit.
    expect(isInvalid('New password')).toBe(false);
    await user.click(screen.getByRole('button', { name: 'Change password' }));

    expect(isInvalid('New password')).toBe(true);
    expect(descriptionOf('New password')).toBe('At least 10 characters');
    expect(api.requests).toHaveLength(0);
  });

  it('sends current and new password and confirms the change', async () => {
    const api = mockApi({ 'POST /api/auth/password': { status: 204 } });
    const { user } = renderWithProviders(<ChangePasswordForm />);

    await fill(user, 'old password 1', 'quartz-window-42', 'quartz-window-42');

    expect(await screen.findByText('Your password has been changed.')).toBeTruthy();
    expect(api.calls('POST', '/api/auth/password').map((r) => r.body)).toEqual([
      { currentPassword: 'old password 1', newPassword: 'quartz-window-42' },
    ]);
    expect((screen.getByLabelText('New password') as HTMLInputElement).value).toBe('');
  });

  it("shows the API's message when the current password is wrong", async () => {
    mockApi({ 'POST /api/auth/password': apiError(400, 'Bad Request', 'The current password is wrong.') });
    const { user } = renderWithProviders(<ChangePasswordForm />);

    await fill(user, 'not my password', 'quartz-window-42', 'quartz-window-42');

    expect((await screen.findByRole('alert')).textContent).toBe('The current password is wrong.');
  });
});
