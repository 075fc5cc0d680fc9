import { screen, waitFor, within } from '@testing-library/react';
import type { AuditEventView } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { AuditGrid } from '../components/audit-grid';

// Answers: GET /audit?entity&entityId&actorId&from&to (admin only; AuditEventView, newest first) as
// in backend/test/audit.e2e-spec.ts. Invented data.
const EVENTS: AuditEventView[] = [
  {
    id: 7,
    at: '2026-12-01T11:00:00.000Z',
    actor: { id: 3, displayName: 'Tomas Reyes', role: 'engineer' },
    entity: 'design',
    entityId: 30,
    action: 'returned',
    summary: 'version 2: submitted → returned (Check 680 nm)',
    details: {},
  },
  {
    id: 6,
    at: '2026-12-01T10:00:00.000Z',
    actor: { id: 4, displayName: 'Priya Nand', role: 'sales' },
    entity: 'spec-mask',
    entityId: 9,
    action: 'revised',
    summary: 'Lens mask rev A → rev B',
    details: {},
  },
];
const DESIGNS = [{ id: 30, name: 'Window 532 AR' }];
const PEOPLE = [
  { id: 3, displayName: 'Tomas Reyes' },
  { id: 4, displayName: 'Priya Nand' },
];

describe('AuditGrid', () => {
  it('lists each change with the record, the action, what changed and who', async () => {
    mockApi({ 'GET /api/audit': { status: 200, body: EVENTS } });
    renderWithProviders(
      <AuditGrid filter={{}} onFilterChange={() => {}} designs={DESIGNS} people={PEOPLE} />,
    );
    const grid = await screen.findByRole('grid', { name: 'Audit trail' });
    await waitFor(() => expect(within(grid).getAllByRole('row')).toHaveLength(3));
    const cells = (row: number) =>
      within(within(grid).getAllByRole('row')[row]!)
        .getAllByRole('gridcell')
        .map((c) => c.textContent);
    expect(cells(1).slice(1)).toEqual([
      'Stack design Window 532 AR',
      'returned',
      'version 2: submitted → returned (Check 680 nm)',
      'Tomas Reyes',
    ]);
    expect(cells(2).slice(1)).toEqual(['Spec mask #9', 'revised', 'Lens mask rev A → rev B', 'Priya Nand']);
    const link = within(grid).getByRole('link', { name: 'Stack design Window 532 AR' });
    expect(link.getAttribute('href')).toBe('/designs/30');
    expect(screen.getByRole('combobox', { name: 'Record' }).textContent).toBe('All records');
    expect(screen.getByRole('combobox', { name: 'Who' }).textContent).toBe('Everyone');
    expect(screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')).toBe(
      '/api/audit/export.csv',
    );
  });

  it('asks the API for one record, one person and a date range, and exports the same filter', async () => {
    const query = '?entity=design&entityId=30&actorId=3&from=2026-12-01&to=2026-12-02';
    const api = mockApi({ [`GET /api/audit${query}`]: { status: 200, body: [EVENTS[0]] } });
    const onFilterChange = vi.fn();
    const filter = {
      entity: 'design' as const,
      entityId: 30,
      actorId: 3,
      from: '2026-12-01',
      to: '2026-12-02',
    };
    const { user } = renderWithProviders(
      <AuditGrid filter={filter} onFilterChange={onFilterChange} designs={DESIGNS} people={PEOPLE} />,
    );
    const grid = await screen.findByRole('grid', { name: 'Audit trail' });
    await waitFor(() => expect(within(grid).getAllByRole('row')).toHaveLength(2));
    expect(api.unexpected).toEqual([]);
    expect(screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')).toBe(
      `/api/audit/export.csv${query}`,
    );

    await user.click(screen.getByRole('combobox', { name: 'Who' }));
    await user.click(await screen.findByRole('option', { name: 'Everyone' }));
    expect(onFilterChange).toHaveBeenCalledWith({ ...filter, actorId: undefined });

    await user.click(screen.getByRole('combobox', { name: 'Record' }));
    await user.click(await screen.findByRole('option', { name: 'All records' }));
    expect(onFilterChange).toHaveBeenLastCalledWith({ ...filter, entity: undefined, entityId: undefined });
  });
});
