import supertest from 'supertest/index.js';
import { CSRF_HEADER } from '@quietglass/shared';

type Target = Parameters<typeof supertest>[0];

/**
 * The e2e tests' HTTP client: supertest with the CSRF header preset on state-changing methods, as
 * the Quietglass client's fetch wrapper sends it. `import request from 'supertest'` in an e2e spec
 * resolves here (vitest.e2e.config.ts); a test that must send a request without the header (the
 * CSRF tests) uses `rawRequest`.
 */
export default function request(app: Target): ReturnType<typeof supertest> {
  const client = supertest(app);
  for (const method of ['post', 'put', 'patch', 'delete'] as const) {
    const open = client[method].bind(client);
    client[method] = (url: string) => open(url).set(CSRF_HEADER, '1');
  }
  client.del = client.delete;
  return client;
}

export const rawRequest = supertest;
