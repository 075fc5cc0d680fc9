import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { MaterialView } from '../../features/materials/api/get-materials';
import { STAFF } from '../../test/fixtures';
import { mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// Flow: an engineer adds a material (POST /api/materials → 201 MaterialView); the detail pane then
// shows the new material, not the one chosen before.

const material = (id: number, name: string, n: number): MaterialView => ({
  id,
  name,
  model: { model: 'constant', n, k: 0 },
  rangeNm: { from: 300, to: 1100 },
  typical: false,
  provenance: { source: 'Invented for this test', date: null, notes: '' },
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
});

describe('materials page', () => {
  it('selects a newly added material, so its detail is the one shown', async () => {
    const glass = material(2, 'Test glass', 1.52);
    const added = material(9, 'Test fluoride', 1.38);
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/materials': [
        { status: 200, body: [glass] },
        { status: 200, body: [glass, added] },
      ],
      'POST /api/materials': { status: 201, body: added },
    });
    const { user } = renderApp('/materials');

    await user.click(await screen.findByRole('gridcell', { name: 'Test glass' }, { timeout: 10_000 }));
    expect(await screen.findByRole('region', { name: 'Material Test glass' })).toBeTruthy();

    await user.click(screen.getByRole('button', { name: 'New material' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'New material' }));
    await user.type(dialog.getByLabelText('Name'), 'Test fluoride');
    await user.clear(dialog.getByLabelText('n'));
    await user.type(dialog.getByLabelText('n'), '1.38');
    await user.type(dialog.getByLabelText('Valid from (nm)'), '300');
    await user.type(dialog.getByLabelText('Valid to (nm)'), '1100');
    await user.type(dialog.getByLabelText('Source'), 'Invented for this test');
    await user.type(dialog.getByLabelText('Date (YYYY-MM-DD)'), '2026-11-30');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));

    expect(
      await screen.findByRole('region', { name: 'Material Test fluoride' }, { timeout: 10_000 }),
    ).toBeTruthy();
    expect(screen.queryByRole('region', { name: 'Material Test glass' })).toBeNull();
  });
});
