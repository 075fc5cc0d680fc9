/** Name of the httpOnly cookie that carries the signed session token. */
export const SESSION_COOKIE = 'qg_session';

export interface SessionClaims {
  sub: number;
  role: string;
}
