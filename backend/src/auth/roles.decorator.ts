import { SetMetadata } from '@nestjs/common';
import type { Role } from '@quietglass/shared';

export const ROLES_KEY = 'quietglass:roles';

/** Restricts a controller or route to the given roles (a route's list overrides its controller's). */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES_KEY, roles);
