import type { UserView } from '@quietglass/shared';
import type { User } from './user.entity.js';

/** The user as the API shows it: never the password hash. */
export function toUserView(user: User): UserView {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    active: user.active,
    mustChangePassword: user.mustChangePassword,
    createdAt: user.createdAt.toISOString(),
    version: user.version,
  };
}
