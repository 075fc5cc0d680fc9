import type { Role } from '@quietglass/shared';

/** How each role is named on screen. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  admin: 'Administrator',
  engineer: 'Engineer',
  sales: 'Sales',
  operator: 'Operator',
};
