import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';

// GET /chambers and GET /materials as the API answers them; invented chamber.
const CHAMBER = {
  id: 7,
  name: 'Bell jar 1',
  monitorWavelengthsNm: [550],
  monitorChipMaterialId: 2,
  materials: [{ materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 }],
  notes: '',
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
};
const MATERIALS = [
  { id: 2, name: 'Fused silica' },
  { id: 4, name: 'MgF2' },
].map((m) => ({
  ...m,
  model: { model: 'constant', n: 1.4, k: 0 },
  rangeNm: { from: 200, to: 2000 },
  typical: true,
  provenance: { source: 'test', date: null, notes: '' },
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
}));

function mockChambersPage(role: 'engineer' | 'operator') {
  mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/chambers': { status: 200, body: [CHAMBER] },
    'GET /api/materials': { status: 200, body: MATERIALS },
    'GET /api/chambers/7/calibration': {
      status: 200,
      body: { chamberId: 7, settings: {}, series: [], suggestions: [], decisions: [] },
    },
  });
}

describe('chambers page', () => {
  it('an engineer opens a chamber for editing with its saved values', async () => {
    mockChambersPage('engineer');
    const { user } = renderApp('/chambers');
    expect(await screen.findByRole('button', { name: 'New chamber' }, { timeout: 10_000 })).toBeTruthy();
    await user.click(await screen.findByRole('button', { name: 'Edit Bell jar 1' }, { timeout: 10_000 }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Edit Bell jar 1' }));
    const row = within(dialog.getByRole('group', { name: 'Material row 1' }));
    expect((row.getByLabelText('Material') as HTMLSelectElement).value).toBe('4');
    expect((row.getByLabelText('Tooling factor') as HTMLInputElement).value).toBe('1.08');
    expect((row.getByLabelText('Rate (nm/s)') as HTMLInputElement).value).toBe('0.8');
  });

  it('an operator reads the chambers and their calibration, with nothing to change', async () => {
    mockChambersPage('operator');
    renderApp('/chambers');
    const section = within(await screen.findByRole('region', { name: 'Bell jar 1' }, { timeout: 10_000 }));
    expect(section.getByText(/1\.08/)).toBeTruthy();
    expect(section.getByRole('button', { name: 'Process settings of Bell jar 1' })).toBeTruthy();
    expect(screen.getByText(/You can read the chamber settings/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'New chamber' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Edit Bell jar 1' })).toBeNull();
  });
});
