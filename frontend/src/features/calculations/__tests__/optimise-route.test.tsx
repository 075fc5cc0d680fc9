import { screen } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { TEST_DESIGN, TEST_MATERIALS, testVersion } from '../../../test/design-fixtures';
import { STAFF } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Roles: the compute queue's POST routes are for admins and engineers (the API's DESIGNERS);
// sales read a design but do not run optimisations.

function api(role: Role) {
  return mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
    'GET /api/designs/12/versions/1': {
      status: 200,
      body: testVersion({ layers: [{ materialId: 4, thicknessNm: 99.64, locked: false, notes: '' }] }),
    },
    'GET /api/designs/12/history': { status: 200, body: [] },
    'GET /api/materials': { status: 200, body: TEST_MATERIALS },
    'GET /api/spec-masks/6': {
      status: 200,
      body: {
        id: 6,
        name: 'Trial mask',
        revision: 'A',
        customer: { id: 3, name: 'Fenwick Optics Lab' },
        bands: [{ from_nm: 500, to_nm: 600, quantity: 'R', max_percent: 1.5 }],
        notes: '',
      },
    },
  });
}

describe('Optimise on the design workspace page', () => {
  it('is there for an engineer, with its three optimisations', async () => {
    api('engineer');
    const { user } = renderApp('/designs/12');
    await user.click(await screen.findByRole('tab', { name: 'Optimise' }, { timeout: 10_000 }));
    await screen.findByRole('region', { name: 'Optimise' });
    expect(screen.getAllByRole('tab').map((t) => t.textContent)).toEqual(
      expect.arrayContaining(['Fit to mask', 'Grow layers', 'Yield forecast']),
    );
    expect(await screen.findByRole('button', { name: 'Run Fit to mask' })).toBeTruthy();
  });

  it('is not shown to sales, who see the design read-only', async () => {
    const calls = api('sales');
    const { user } = renderApp('/designs/12');
    await user.click(await screen.findByRole('tab', { name: 'Full analysis' }, { timeout: 10_000 }));
    await screen.findByRole('region', { name: 'Full analysis' });
    expect(screen.queryByRole('tab', { name: 'Optimise' })).toBeNull();
    expect(screen.queryByRole('region', { name: 'Optimise', hidden: true })).toBeNull();
    expect(screen.queryByRole('button', { name: /Run (Fit to mask|Grow layers|Yield forecast)/ })).toBeNull();
    expect(calls.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });
});
