import { CanActivate, ExecutionContext, Injectable, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { JwtService } from '@nestjs/jwt';
import { UsersService } from '../users/users.service.js';
import type { AuthedRequest } from './current-user.decorator.js';
import { IS_PUBLIC } from './public.decorator.js';
import { SESSION_COOKIE, type SessionClaims } from './session.js';

/**
 * Global guard: every route needs a valid session (cookie, or `Authorization: Bearer` for scripts)
 * of an active user, unless marked @Public(). The user is reloaded on each request so a role change
 * or deactivation takes effect at once.
 */
@Injectable()
export class SessionGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    private readonly jwt: JwtService,
    private readonly users: UsersService,
  ) {}

  async canActivate(ctx: ExecutionContext): Promise<boolean> {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, [ctx.getHandler(), ctx.getClass()]);
    if (isPublic) return true;
    const req = ctx.switchToHttp().getRequest<AuthedRequest>();
    const token = tokenOf(req);
    if (!token) throw new UnauthorizedException('Sign in first');
    let claims: SessionClaims;
    try {
      claims = await this.jwt.verifyAsync<SessionClaims>(token);
    } catch {
      throw new UnauthorizedException('Your session has expired; sign in again');
    }
    const user = await this.users.findById(claims.sub);
    if (!user || !user.active) throw new UnauthorizedException('Your account is not active; sign in again');
    req.user = user;
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
