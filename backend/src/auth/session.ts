/** Name of the httpOnly cookie that carries the signed session token. */
export const SESSION_COOKIE = 'qg_session';

/** Header every state-changing browser request must carry (a cross-site form cannot set it). */
export { CSRF_HEADER } from '@quietglass/shared';

export interface SessionClaims {
  /** User id. */
  sub: number;
  /** Server-side session id: the token is good only while that session is open. */
  sid: string;
}
