export const SIGN_IN_PATH = '/sign-in';

/** The sign-in address that returns to `path` afterwards. */
export function signInPathFor(path: string): string {
  return path === '/' || path === '' ? SIGN_IN_PATH : `${SIGN_IN_PATH}?next=${encodeURIComponent(path)}`;
}

/**
 * The page to open after sign-in: only paths inside this app (no other origin, no
 * protocol-relative `//host`), and never the sign-in page itself.
 */
export function safeNextPath(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  if (next === SIGN_IN_PATH || next.startsWith(`${SIGN_IN_PATH}?`)) return '/';
  return next;
}
