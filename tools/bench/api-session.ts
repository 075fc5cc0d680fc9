/*
 * What the API benchmarks share: their command-line options, the project root, and a JSON client
 * that keeps the session cookie and sends the header the API wants on every change.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { CSRF_HEADER } from '@quietglass/shared';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** The value after `name` on the command line, or `fallback`. */
export function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(name);
  return i >= 0 ? (process.argv[i + 1] ?? fallback) : fallback;
}

export type Api = <T>(method: string, url: string, body?: unknown) => Promise<{ status: number; body: T }>;

/** A client of the API at `base`; the first answer that sets a session cookie signs it in. */
export function apiSession(base: string): Api {
  let cookie = '';
  return async <T>(method: string, url: string, body?: unknown) => {
    const res = await fetch(`${base}/api${url}`, {
      method,
      headers: {
        'Content-Type': 'application/json',
        [CSRF_HEADER]: '1',
        ...(cookie ? { Cookie: cookie } : {}),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.get('set-cookie');
    if (set) cookie = set.split(';')[0] ?? '';
    const text = await res.text();
    return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
  };
}

/** Signs `api` in as the demo shop's first engineer, read from the sign-ins file `npm start` writes. */
export async function signInDemoEngineer(
  api: Api,
  base: string,
  credentials = path.join(ROOT, '.data', 'demo-sign-ins.json'),
): Promise<void> {
  const signIns = JSON.parse(fs.readFileSync(credentials, 'utf8')) as {
    email: string;
    role: string;
    password: string;
  }[];
  const engineer = signIns.find((s) => s.role === 'engineer');
  if (!engineer) throw new Error('no demo engineer; run npm start first');
  const signIn = await api('POST', '/auth/sign-in', { email: engineer.email, password: engineer.password });
  if (signIn.status !== 200)
    throw new Error(`sign-in failed (${signIn.status}); is npm start running at ${base}?`);
}
