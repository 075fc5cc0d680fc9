import type { Role } from '@quietglass/shared';

/** How each role is named on screen. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  admin: 'Administrator',
  engineer: 'Engineer',
  sales: 'Sales',
  operator: 'Operator',
};

/** Roles that change materials, designs and the compute queue (the API's DESIGNERS). */
const DESIGNER_ROLES: ReadonlySet<Role> = new Set(['admin', 'engineer']);

export function isDesigner(role: Role): boolean {
  return DESIGNER_ROLES.has(role);
}
