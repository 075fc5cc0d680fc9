import type { Role, UserView } from '@quietglass/shared';

/** Invented staff of an invented coating shop, for tests only. */
export const STAFF: Record<Role, UserView> = {
  admin: {
    id: 1,
    email: 'mira.holt@larkmoor-optics.example',
    displayName: 'Mira Holt',
    role: 'admin',
    active: true,
    mustChangePassword: false,
    createdAt: '2026-11-02T08:15:00.000Z',
    version: 1,
  },
  engineer: {
    id: 2,
    email: 'tomas.reyne@larkmoor-optics.example',
    displayName: 'Tomas Reyne',
    role: 'engineer',
    active: true,
    mustChangePassword: false,
    createdAt: '2026-11-03T09:30:00.000Z',
    version: 1,
  },
  sales: {
    id: 3,
    email: 'ines.calder@larkmoor-optics.example',
    displayName: 'Ines Calder',
    role: 'sales',
    active: true,
    mustChangePassword: false,
    createdAt: '2026-11-04T10:45:00.000Z',
    version: 1,
  },
  operator: {
    id: 4,
    email: 'jonah.pell@larkmoor-optics.example',
    displayName: 'Jonah Pell',
    role: 'operator',
    active: false,
    mustChangePassword: false,
    createdAt: '2026-11-05T11:00:00.000Z',
    version: 1,
  },
};

export const HEALTH_OK = {
  status: 'ok',
  database: { ok: true },
  redis: { ok: true },
  queue: { ok: true },
  worker: { ok: true },
};
