import {
  CanActivate,
  ExecutionContext,
  ForbiddenException,
  Injectable,
  UnauthorizedException,
} from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { JwtService } from '@nestjs/jwt';
import { SessionsService } from '../sessions/sessions.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthedRequest } from './current-user.decorator.js';
import { ALLOWED_BEFORE_PASSWORD_CHANGE, IS_PUBLIC } from './public.decorator.js';
import { SESSION_COOKIE, type SessionClaims } from './session.js';

/**
 * Global guard: every route needs an open server-side session (cookie, or `Authorization: Bearer`
 * for scripts) of an active user, unless marked @Public(). The session is renewed on use and ends
 * after the idle timeout; the user is reloaded on each request. A user whose password an admin set
 * may only change it (and read who they are, or sign out) until they have.
 */
@Injectable()
export class SessionGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    private readonly jwt: JwtService,
    private readonly users: UsersService,
    private readonly sessions: SessionsService,
  ) {}

  async canActivate(ctx: ExecutionContext): Promise<boolean> {
    const targets = [ctx.getHandler(), ctx.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const req = ctx.switchToHttp().getRequest<AuthedRequest>();
    const token = tokenOf(req);
    if (!token) throw new UnauthorizedException('Sign in first');
    let claims: SessionClaims;
    try {
      claims = await this.jwt.verifyAsync<SessionClaims>(token);
    } catch {
      throw new UnauthorizedException('Your session has expired; sign in again');
    }
    if (typeof claims.sid !== 'string' || !Number.isInteger(claims.sub))
      throw new UnauthorizedException('Your session has expired; sign in again');
    const session = await this.sessions.touch(claims.sid, claims.sub);
    if (!session) throw new UnauthorizedException('Your session has ended; sign in again');
    const user = await this.users.findById(claims.sub);
    if (!user || !user.active) throw new UnauthorizedException('Your account is not active; sign in again');
    if (
      user.mustChangePassword &&
      !this.reflector.getAllAndOverride<boolean>(ALLOWED_BEFORE_PASSWORD_CHANGE, targets)
    ) {
      throw new ForbiddenException('Choose your own password first (Account → Change password)');
    }
    req.user = user;
    req.sessionId = session.id;
    return true;
  }
}

function tokenOf(req: AuthedRequest): string | null {
  const cookies = req.cookies as Record<string, string | undefined> | undefined;
  const fromCookie = cookies?.[SESSION_COOKIE];
  if (fromCookie) return fromCookie;
  const header = req.headers.authorization;
  if (header?.startsWith('Bearer ')) return header.slice('Bearer '.length).trim() || null;
  return null;
}
