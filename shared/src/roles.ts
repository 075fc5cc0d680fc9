/** The four roles of a coating shop that sign in to Quietglass. */
export const ROLES = ['admin', 'engineer', 'sales', 'operator'] as const;
export type Role = (typeof ROLES)[number];

/** True when `value` is one of the known roles. */
export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** Signed-in user as the API returns it (never with a password hash). */
export interface UserView {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  active: boolean;
  /** The password was set by an admin: the user must choose their own before anything else. */
  mustChangePassword: boolean;
  createdAt: string;
  /** Counts the account's changes; an edit sends back the one it was based on. */
  version: number;
}

/** Sections of the app shell, and which roles may open each. The API enforces the same rules. */
export const NAV_SECTIONS = [
  { key: 'designs', label: 'Stack designs', path: '/designs', roles: ['admin', 'engineer', 'sales'] },
  { key: 'materials', label: 'Materials', path: '/materials', roles: ['admin', 'engineer'] },
  { key: 'customers', label: 'Customers', path: '/customers', roles: ['admin', 'engineer', 'sales'] },
  { key: 'masks', label: 'Spec masks', path: '/spec-masks', roles: ['admin', 'engineer', 'sales'] },
  { key: 'queue', label: 'Compute queue', path: '/compute-queue', roles: ['admin', 'engineer'] },
  { key: 'recipes', label: 'Released recipes', path: '/recipes', roles: ['admin', 'engineer', 'operator'] },
  { key: 'runs', label: 'Chamber runs', path: '/runs', roles: ['admin', 'engineer', 'operator'] },
  { key: 'chambers', label: 'Chambers', path: '/chambers', roles: ['admin', 'engineer', 'operator'] },
  { key: 'reports', label: 'Compliance reports', path: '/reports', roles: ['admin', 'engineer', 'sales'] },
  { key: 'quotes', label: 'Quotes', path: '/quotes', roles: ['admin', 'engineer', 'sales'] },
  { key: 'outbox', label: 'Outbox', path: '/admin/outbox', roles: ['admin'] },
  { key: 'audit', label: 'Audit trail', path: '/admin/audit', roles: ['admin'] },
  { key: 'users', label: 'Users', path: '/admin/users', roles: ['admin'] },
] as const satisfies readonly { key: string; label: string; path: string; roles: readonly Role[] }[];

export type NavSection = (typeof NAV_SECTIONS)[number];

/** Navigation sections a role may use, in display order. */
export function navSectionsFor(role: Role): NavSection[] {
  return NAV_SECTIONS.filter((s) => (s.roles as readonly Role[]).includes(role));
}

/**
 * Header (with value `1`) that every state-changing API request from a browser must carry. A
 * cross-site form or image cannot set a custom header, and a cross-site script would need a CORS
 * grant the API never gives: so a request with it was made by the Quietglass client itself.
 */
export const CSRF_HEADER = 'x-quietglass-request';
