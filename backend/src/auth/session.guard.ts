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
import type { User } from '../users/user.entity.js';
import { UsersService } from '../users/users.service.js';
import type { AuthedRequest } from './current-user.decorator.js';
import { ALLOWED_BEFORE_PASSWORD_CHANGE, IS_PUBLIC, OPTIONAL_SESSION } from './public.decorator.js';
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
    const req = ctx.switchToHttp().getRequest<AuthedRequest>();
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) {
      if (this.reflector.getAllAndOverride<boolean>(OPTIONAL_SESSION, targets)) {
        await this.authenticate(req).catch((err: unknown) => {
          if (!(err instanceof UnauthorizedException)) throw err;
        });
      }
      return true;
    }
    const user = await this.authenticate(req);
    if (
      user.mustChangePassword &&
      !this.reflector.getAllAndOverride<boolean>(ALLOWED_BEFORE_PASSWORD_CHANGE, targets)
    ) {
      throw new ForbiddenException('Choose your own password first (Account → Change password)');
    }
    return true;
  }

  /** Loads the user and session of the request's token onto it; 401 when there is none. */
  private async authenticate(req: AuthedRequest): Promise<User> {
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
    req.user = user;
    req.sessionId = session.id;
    return user;
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
