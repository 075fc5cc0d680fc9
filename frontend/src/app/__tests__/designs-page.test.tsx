import { screen, within } from '@testing-library/react';
import type { DesignSummaryView } from '@quietglass/shared';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Roles: Stack designs are read by office roles and written by admins and engineers (the API's
// DESIGNERS); the design-workspace API contract, GET /designs.

const SUMMARY: DesignSummaryView = {
  id: 12,
  name: 'Lens AR trial',
  customer: { id: 3, name: 'Fenwick Optics Lab' },
  specMaskId: 6,
  latestVersion: { number: 2, status: 'submitted', updatedAt: '2026-12-01T10:00:00.000Z' },
  createdBy: { id: 2, displayName: 'Tomas Reyne' },
  createdAt: '2026-12-01T08:00:00.000Z',
  version: 1,
};

function api(role: 'engineer' | 'sales') {
  return mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/designs': { status: 200, body: [SUMMARY] },
    'GET /api/customers': { status: 200, body: [] },
    'GET /api/spec-masks': { status: 200, body: [] },
    'GET /api/materials': { status: 200, body: [] },
  });
}

describe('Stack designs page', () => {
  it('lists designs with customer, latest version and status, author; engineers get "New design"', async () => {
    api('engineer');
    renderApp('/designs');

    const link = await screen.findByRole('link', { name: 'Lens AR trial' }, { timeout: 10_000 });
    expect(link.getAttribute('href')).toBe('/designs/12');
    const row = link.closest('[role="row"]') as HTMLElement;
    expect(within(row).getByRole('gridcell', { name: 'Fenwick Optics Lab' })).toBeTruthy();
    expect(within(row).getByText('submitted')).toBeTruthy();
    expect(within(row).getByRole('gridcell', { name: 'Tomas Reyne' })).toBeTruthy();
    expect(await screen.findByRole('button', { name: 'New design' })).toBeTruthy();
  });

  it('shows sales the list without "New design"', async () => {
    const calls = api('sales');
    renderApp('/designs');

    expect(await screen.findByRole('link', { name: 'Lens AR trial' }, { timeout: 10_000 })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'New design' })).toBeNull();
    // Nothing is fetched for a dialog sales cannot open.
    expect(calls.calls('GET', '/api/spec-masks')).toHaveLength(0);
  });
});
