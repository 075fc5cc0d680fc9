import { CSRF_HEADER } from '@quietglass/shared';

/** Base path of every API route; the dev server proxies it to the API process. */
export const API_BASE = '/api';

/**
 * Calls that answer 401 as part of their normal work: a wrong password at sign-in, or "nobody is
 * signed in" from the session check. Any other 401 means the session ended.
 */
const SESSION_CHECK_PATHS: ReadonlySet<string> = new Set(['/auth/sign-in', '/auth/me', '/auth/session']);

/** An API answer outside 2xx, or no answer at all (status 0), with the server's own message. */
export class ApiError extends Error {
  override readonly name = 'ApiError';

  constructor(
    /** HTTP status; 0 when the server could not be reached or sent something unreadable. */
    readonly status: number,
    message: string,
    /** Per-field validation messages, when the server sent them. */
    readonly details: readonly string[] = [],
    /** The parsed error body, for callers that read more than the message. */
    readonly body: unknown = undefined,
  ) {
    super(message);
  }
}

type UnauthorizedHandler = () => void;
let unauthorizedHandler: UnauthorizedHandler | null = null;

/**
 * Sets what happens when a call finds the session gone (401 outside sign-in and the session check).
 * Returns a function that removes the handler again.
 */
export function setUnauthorizedHandler(handler: UnauthorizedHandler): () => void {
  unauthorizedHandler = handler;
  return () => {
    if (unauthorizedHandler === handler) unauthorizedHandler = null;
  };
}

export type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface ApiRequestOptions {
  method?: HttpMethod;
  /** Sent as JSON. */
  body?: unknown;
  signal?: AbortSignal;
}

const STATUS_FALLBACK_MESSAGES: Readonly<Record<number, string>> = {
  400: 'The request was not accepted.',
  401: 'You are not signed in.',
  403: 'Your role may not do this.',
  404: 'Not found.',
  409: 'This conflicts with the current data.',
  429: 'Too many requests — wait a minute and try again.',
};

function fallbackMessage(status: number): string {
  return (
    STATUS_FALLBACK_MESSAGES[status] ??
    (status >= 500 ? `The server failed to answer (HTTP ${status}).` : `Request failed (HTTP ${status}).`)
  );
}

/** Builds an ApiError from an error body of the shape `{ statusCode, error, message, details? }`. */
export function toApiError(status: number, body: unknown): ApiError {
  if (typeof body === 'object' && body !== null) {
    const { message, details } = body as { message?: unknown; details?: unknown };
    const detailList = Array.isArray(details)
      ? details.filter((d): d is string => typeof d === 'string')
      : [];
    if (typeof message === 'string' && message.trim() !== '') {
      return new ApiError(status, message, detailList, body);
    }
    if (Array.isArray(message)) {
      const parts = message.filter((m): m is string => typeof m === 'string');
      if (parts.length > 0)
        return new ApiError(status, parts.join('; '), detailList.length ? detailList : parts, body);
    }
    return new ApiError(status, fallbackMessage(status), detailList, body);
  }
  return new ApiError(status, fallbackMessage(status), [], body);
}

async function readBody(response: Response): Promise<{ ok: true; value: unknown } | { ok: false }> {
  const text = await response.text();
  if (text.trim() === '') return { ok: true, value: undefined };
  try {
    return { ok: true, value: JSON.parse(text) as unknown };
  } catch {
    return { ok: false };
  }
}

/**
 * The one fetch wrapper of the client: same-origin cookies, JSON in and out, an ApiError for
 * every failure. `path` is relative to the API base, e.g. `/users/4`.
 */
export async function apiRequest<T>(path: string, options: ApiRequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal } = options;
  // The API refuses state-changing requests without this header: a cross-site form cannot send it.
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers[CSRF_HEADER] = '1';
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(`${API_BASE}${path}`, {
      method,
      credentials: 'same-origin',
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'The server could not be reached. Check the connection and try again.');
  }

  const parsed = await readBody(response);
  if (response.ok) {
    if (!parsed.ok) throw new ApiError(0, `The server sent an answer that is not JSON (${method} ${path}).`);
    return parsed.value as T;
  }

  const error = toApiError(response.status, parsed.ok ? parsed.value : undefined);
  const routePath = path.split('?')[0] ?? path;
  if (response.status === 401 && !SESSION_CHECK_PATHS.has(routePath)) unauthorizedHandler?.();
  throw error;
}

export const apiClient = {
  get: <T>(path: string, signal?: AbortSignal) => apiRequest<T>(path, { method: 'GET', signal }),
  post: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'POST', body }),
  patch: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  put: <T>(path: string, body: unknown) => apiRequest<T>(path, { method: 'PUT', body }),
};

/** The address of an API route for a link or download (the browser fetches it itself). */
export function apiUrl(path: string): string {
  return `${API_BASE}${path}`;
}
