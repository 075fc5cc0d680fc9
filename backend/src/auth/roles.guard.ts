import { CanActivate, ExecutionContext, ForbiddenException, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Role } from '@quietglass/shared';
import type { AuthedRequest } from './current-user.decorator.js';
import { ROLES_KEY } from './roles.decorator.js';

/** Global guard after SessionGuard: enforces @Roles(...) on the route or its controller. */
@Injectable()
export class RolesGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(ctx: ExecutionContext): boolean {
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, [
      ctx.getHandler(),
      ctx.getClass(),
    ]);
    if (!roles || roles.length === 0) return true;
    const user = ctx.switchToHttp().getRequest<AuthedRequest>().user;
    if (!user) return true; // public route: SessionGuard let it through on purpose
    if (!roles.includes(user.role)) {
      throw new ForbiddenException(
        `This needs the role ${roles.join(' or ')}; you are signed in as ${user.role}`,
      );
    }
    return true;
  }
}
