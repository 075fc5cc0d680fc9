import { screen, waitFor, within } from '@testing-library/react';
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
  revision: 1,
  model: { model: 'constant', n, k: 0 },
  rangeNm: { from: 300, to: 1100 },
  typical: false,
  provenance: { kind: 'published', source: 'Invented for this test', date: null, run: '', notes: '' },
  retiredAt: null,
  sourceFile: null,
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
    await user.selectOptions(dialog.getByLabelText('Provenance'), 'typical');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));

    expect(
      await screen.findByRole('region', { name: 'Material Test fluoride' }, { timeout: 10_000 }),
    ).toBeTruthy();
    expect(screen.queryByRole('region', { name: 'Material Test glass' })).toBeNull();
    // The whole page and the material form with its live readout: slow in jsdom on a busy machine.
  }, 60_000);

  it('shows a revised material’s revision and what its earlier revisions held', async () => {
    const oxide = { ...material(5, 'Test oxide', 2.1), revision: 2 };
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/materials': { status: 200, body: [oxide] },
      'GET /api/materials/5/revisions': {
        status: 200,
        body: [
          {
            revision: 1,
            name: 'Test oxide',
            model: { model: 'constant', n: 2.05, k: 0 },
            rangeNm: { from: 300, to: 1100 },
            typical: false,
            provenance: { source: 'Invented for this test', date: null, notes: '' },
            supersededAt: '2026-12-01T09:30:00.000Z',
            supersededBy: 'Tomas Reyne',
          },
        ],
      },
    });
    const { user } = renderApp('/materials');
    await user.click(await screen.findByRole('gridcell', { name: 'Test oxide' }, { timeout: 10_000 }));
    const detail = within(await screen.findByRole('region', { name: 'Material Test oxide' }));
    expect(detail.getByText(/· revision 2 · version 1,/)).toBeTruthy();
    const earlier = within(await detail.findByRole('region', { name: 'Earlier revisions' }));
    const line = await earlier.findByText(/^Revision 1: Test oxide/);
    expect(line.textContent).toMatch(/n = 2\.05/);
    expect(line.textContent).toMatch(/valid 300–1100 nm · replaced .+ by Tomas Reyne$/);
  });

  it('hides retired materials until asked, labels provenance, offers the original file and retires', async () => {
    const film = {
      ...material(6, 'Test film', 1.46),
      provenance: {
        kind: 'measured' as const,
        source: 'Witness on B270',
        date: '2026-11-28',
        run: 'B2-2026-118',
        notes: '',
      },
      sourceFile: { fileName: 'film run 118.csv', mediaType: 'text/csv', sizeBytes: 2345 },
    };
    const old = { ...material(7, 'Old film', 1.47), retiredAt: '2026-11-30T10:00:00.000Z' };
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/materials': { status: 200, body: [film, old] },
      'POST /api/materials/6/retire': {
        status: 201,
        body: { ...film, retiredAt: '2026-12-03T06:00:00.000Z' },
      },
    });
    const { user } = renderApp('/materials');
    await user.click(await screen.findByRole('gridcell', { name: 'Test film' }, { timeout: 10_000 }));
    expect(screen.queryByRole('gridcell', { name: 'Old film (retired)' })).toBeNull();
    expect(screen.getByRole('gridcell', { name: 'Measured on our process' })).toBeTruthy();

    const detail = within(await screen.findByRole('region', { name: 'Material Test film' }));
    expect(detail.getByLabelText('Provenance').textContent).toBe(
      'Measured on our process on 2026-11-28, run B2-2026-118: Witness on B270',
    );
    const link = detail.getByRole('link', { name: 'film run 118.csv' });
    expect(link.getAttribute('href')).toBe('/api/materials/6/source-file');
    expect(detail.getByText(/\(2\.3 kB\)/)).toBeTruthy();

    await user.click(detail.getByRole('button', { name: 'Retire' }));
    await waitFor(() => expect(api.calls('POST', '/api/materials/6/retire')).toHaveLength(1));
    expect(api.calls('POST', '/api/materials/6/retire')[0]!.body).toEqual({ version: 1 });

    await user.click(screen.getByLabelText('Show retired materials'));
    expect(await screen.findByRole('gridcell', { name: 'Old film (retired)' })).toBeTruthy();
  });
});
