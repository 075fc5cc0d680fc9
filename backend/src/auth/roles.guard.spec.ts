import { ForbiddenException, type ExecutionContext } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { describe, expect, it } from 'vitest';
import type { Role } from '@quietglass/shared';
import { Roles } from './roles.decorator.js';
import { RolesGuard } from './roles.guard.js';

@Roles('admin', 'engineer')
class DesignsLikeController {
  edit(): void {}
  @Roles('admin')
  purge(): void {}
}

function ctx(handler: () => void, role?: Role): ExecutionContext {
  return {
    getHandler: () => handler,
    getClass: () => DesignsLikeController,
    switchToHttp: () => ({ getRequest: () => ({ user: role ? { role } : undefined }) }),
  } as unknown as ExecutionContext;
}

describe('RolesGuard', () => {
  const guard = new RolesGuard(new Reflector());
  const proto = DesignsLikeController.prototype;

  it('lets a listed role through and stops others with 403 naming the roles', () => {
    expect(guard.canActivate(ctx(proto.edit, 'engineer'))).toBe(true);
    expect(() => guard.canActivate(ctx(proto.edit, 'sales'))).toThrow(ForbiddenException);
    expect(() => guard.canActivate(ctx(proto.edit, 'operator'))).toThrow(
      'This needs the role admin or engineer; you are signed in as operator',
    );
  });

  it('a route-level list overrides the controller list', () => {
    expect(guard.canActivate(ctx(proto.purge, 'admin'))).toBe(true);
    expect(() => guard.canActivate(ctx(proto.purge, 'engineer'))).toThrow(ForbiddenException);
  });
});
