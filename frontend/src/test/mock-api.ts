import { elementAt } from '@quietglass/shared';
import { vi } from 'vitest';

export interface MockResponse {
  status: number;
  /** Sent as JSON; omitted for an empty body. */
  body?: unknown;
  /** Sent as-is instead of `body`, for answers that are not JSON. */
  text?: string;
}

export interface RecordedRequest {
  method: string;
  path: string;
  /** Parsed JSON body, or undefined. */
  body: unknown;
  init: RequestInit | undefined;
}

type Handler = MockResponse | ((request: RecordedRequest) => MockResponse);

/** Error body in the API's one shape. */
export function apiError(status: number, error: string, message: string, details?: string[]): MockResponse {
  return { status, body: { statusCode: status, error, message, ...(details ? { details } : {}) } };
}

/**
 * Replaces `fetch` with a table of answers keyed "METHOD /api/path". A handler that is a list
 * answers in turn and then repeats its last entry. Requests without a handler get a 404 and are
 * listed in `unexpected`.
 */
export function mockApi(handlers: Record<string, Handler | Handler[]>) {
  const requests: RecordedRequest[] = [];
  const unexpected: string[] = [];
  const served = new Map<string, number>();

  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '');
    const method = (init?.method ?? 'GET').toUpperCase();
    const rawBody = init?.body;
    const request: RecordedRequest = {
      method,
      path,
      body: typeof rawBody === 'string' ? (JSON.parse(rawBody) as unknown) : undefined,
      init,
    };
    requests.push(request);

    const key = `${method} ${path}`;
    const entry = handlers[key];
    let handler: Handler;
    if (entry === undefined) {
      unexpected.push(key);
      handler = apiError(404, 'Not Found', `No mock for ${key}`);
    } else if (Array.isArray(entry)) {
      const index = served.get(key) ?? 0;
      served.set(key, index + 1);
      handler = elementAt(entry, Math.min(index, entry.length - 1), `the mocked answers to ${key}`);
    } else {
      handler = entry;
    }
    const response = typeof handler === 'function' ? handler(request) : handler;
    const payload = response.text ?? (response.body === undefined ? null : JSON.stringify(response.body));
    return new Response(payload, {
      status: response.status,
      headers:
        response.text === undefined
          ? { 'Content-Type': 'application/json' }
          : { 'Content-Type': 'text/html' },
    });
  });

  vi.stubGlobal('fetch', fetchMock);

  return {
    fetchMock,
    requests,
    unexpected,
    /** The requests made to one route, e.g. `calls('POST', '/api/users')`. */
    calls: (method: string, path: string) => requests.filter((r) => r.method === method && r.path === path),
  };
}
