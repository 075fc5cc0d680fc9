import { afterEach, describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../test/mock-api';
import { ApiError, apiClient, setUnauthorizedHandler } from '../api-client';

// Expected behaviour: the API contract of the Foundation issue (base path /api, JSON, session
// cookie, error body { statusCode, error, message, details? }).

let disconnect: (() => void) | null = null;
afterEach(() => {
  disconnect?.();
  disconnect = null;
});

async function caught(promise: Promise<unknown>): Promise<ApiError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof ApiError) return error;
    throw error;
  }
  throw new Error('expected the call to fail');
}

describe('apiClient', () => {
  it('sends JSON with same-origin cookies under /api and returns the parsed answer', async () => {
    const api = mockApi({ 'PATCH /api/users/7': { status: 200, body: { id: 7, role: 'sales' } } });

    const answer = await apiClient.patch('/users/7', { role: 'sales' });

    expect(answer).toEqual({ id: 7, role: 'sales' });
    expect(api.requests).toHaveLength(1);
    const { init, body } = api.requests[0]!;
    expect(init?.method).toBe('PATCH');
    expect(init?.credentials).toBe('same-origin');
    // A change carries the header the API requires against cross-site request forgery.
    expect(init?.headers).toEqual({
      Accept: 'application/json',
      'x-quietglass-request': '1',
      'Content-Type': 'application/json',
    });
    expect(body).toEqual({ role: 'sales' });
  });

  it('sends no CSRF header on a read', async () => {
    const api = mockApi({ 'GET /api/users': { status: 200, body: [] } });
    await apiClient.get('/users');
    expect(api.requests[0]!.init?.headers).toEqual({ Accept: 'application/json' });
  });

  it('returns undefined for 204 No Content', async () => {
    mockApi({ 'POST /api/auth/sign-out': { status: 204 } });
    await expect(apiClient.post('/auth/sign-out')).resolves.toBeUndefined();
  });

  it('throws an ApiError with status, message and details from the error body', async () => {
    mockApi({
      'POST /api/users': apiError(400, 'Bad Request', 'Validation failed', [
        'password must be at least 10 characters',
      ]),
    });

    const error = await caught(apiClient.post('/users', { password: 'short' }));

    expect(error.status).toBe(400);
    expect(error.message).toBe('Validation failed');
    expect(error.details).toEqual(['password must be at least 10 characters']);
  });

  it('names the status when the error body is not the API shape', async () => {
    mockApi({ 'GET /api/users': { status: 502, text: '<html>Bad gateway</html>' } });

    const error = await caught(apiClient.get('/users'));

    expect(error.status).toBe(502);
    expect(error.message).toBe('The server failed to answer (HTTP 502).');
  });

  it('reports an unreachable server as status 0', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')));

    const error = await caught(apiClient.get('/users'));

    expect(error.status).toBe(0);
    expect(error.message).toBe('The server could not be reached. Check the connection and try again.');
  });

  it('calls the unauthorized handler on a 401 from an ordinary call', async () => {
    mockApi({ 'GET /api/users': apiError(401, 'Unauthorized', 'Sign in first.') });
    const onUnauthorized = vi.fn();
    disconnect = setUnauthorizedHandler(onUnauthorized);

    const error = await caught(apiClient.get('/users'));

    expect(error.status).toBe(401);
    expect(error.message).toBe('Sign in first.');
    expect(onUnauthorized).toHaveBeenCalledTimes(1);
  });

  it('leaves a 401 from sign-in and from the session check to the caller', async () => {
    mockApi({
      'POST /api/auth/sign-in': apiError(401, 'Unauthorized', 'Wrong e-mail or password.'),
      'GET /api/auth/session': apiError(401, 'Unauthorized', 'Not signed in.'),
    });
    const onUnauthorized = vi.fn();
    disconnect = setUnauthorizedHandler(onUnauthorized);

    expect(
      (await caught(apiClient.post('/auth/sign-in', { email: 'a@b.example', password: 'x' }))).status,
    ).toBe(401);
    expect((await caught(apiClient.get('/auth/session'))).status).toBe(401);
    expect(onUnauthorized).not.toHaveBeenCalled();
  });

  it('does not call a handler that was removed', async () => {
    mockApi({ 'GET /api/users': apiError(401, 'Unauthorized', 'Sign in first.') });
    const onUnauthorized = vi.fn();
    setUnauthorizedHandler(onUnauthorized)();

    await caught(apiClient.get('/users'));

    expect(onUnauthorized).not.toHaveBeenCalled();
  });
});
