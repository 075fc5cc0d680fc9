import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf, isInvalid } from '../../../test/queries';
import { renderWithProviders } from '../../../test/render';
import { getMeQueryOptions } from '../api/get-me';
import { SignInForm } from '../components/sign-in-form';

// Rules and answers: the sign-in DTO and API contract of the Foundation issue (e-mail format,
// password required; 401 "Wrong e-mail or password."; 429 for too many attempts).

describe('SignInForm', () => {
  it('asks for both fields and sends nothing when they are empty', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<SignInForm />);

    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Enter an e-mail address')).toBeTruthy();
    expect(isInvalid('E-mail')).toBe(true);
    expect(descriptionOf('Password')).toBe('Enter your password');
    expect(isInvalid('Password')).toBe(true);
    expect(api.requests).toHaveLength(0);
  });

  it('rejects a malformed e-mail address without calling the API', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<SignInForm />);

    await user.type(screen.getByLabelText('E-mail'), 'mira.holt-at-larkmoor');
    await user.type(screen.getByLabelText('Password'), 'anything at all');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(descriptionOf('E-mail')).toBe('Enter a valid e-mail address');
    expect(isInvalid('Password')).toBe(false);
    expect(api.requests).toHaveLength(0);
  });

  it("shows the API's message on 401", async () => {
    const api = mockApi({
      'POST /api/auth/sign-in': apiError(401, 'Unauthorized', 'Wrong e-mail or password.'),
    });
    const { user } = renderWithProviders(<SignInForm />);

    await user.type(screen.getByLabelText('E-mail'), ' mira.holt@larkmoor-optics.example ');
    await user.type(screen.getByLabelText('Password'), 'not her password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect((await screen.findByRole('alert')).textContent).toBe('Wrong e-mail or password.');
    expect(api.calls('POST', '/api/auth/sign-in').map((r) => r.body)).toEqual([
      { email: 'mira.holt@larkmoor-optics.example', password: 'not her password' },
    ]);
  });

  it('asks the user to wait on 429', async () => {
    mockApi({
      'POST /api/auth/sign-in': apiError(429, 'Too Many Requests', 'ThrottlerException: Too Many Requests'),
    });
    const { user } = renderWithProviders(<SignInForm />);

    await user.type(screen.getByLabelText('E-mail'), 'mira.holt@larkmoor-optics.example');
    await user.type(screen.getByLabelText('Password'), 'some password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect((await screen.findByRole('alert')).textContent).toBe('Too many attempts — wait a minute');
  });

  it('stores the signed-in user as the session user on success', async () => {
    mockApi({ 'POST /api/auth/sign-in': { status: 200, body: { user: STAFF.engineer } } });
    const { user, queryClient } = renderWithProviders(<SignInForm />);

    await user.type(screen.getByLabelText('E-mail'), STAFF.engineer.email);
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    await expect.poll(() => queryClient.getQueryData(getMeQueryOptions().queryKey)).toEqual(STAFF.engineer);
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
