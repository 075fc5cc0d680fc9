import { screen, waitFor, within } from '@testing-library/react';
import type { VersionEventView } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { AuditGrid } from '../components/audit-grid';

// Answers: GET /audit?designId&actorId (admin only; VersionEventView, newest first) as in
// backend/test/approvals.e2e-spec.ts. Invented data.
const EVENTS: VersionEventView[] = [
  {
    id: 7,
    designId: 30,
    versionNumber: 2,
    from: 'submitted',
    to: 'returned',
    actor: { id: 3, displayName: 'Tomas Reyes', role: 'engineer' },
    comment: 'Check 680 nm',
    at: '2026-12-01T11:00:00.000Z',
  },
  {
    id: 6,
    designId: 30,
    versionNumber: 2,
    from: 'draft',
    to: 'submitted',
    actor: { id: 2, displayName: 'Mira Castell', role: 'engineer' },
    comment: '',
    at: '2026-12-01T10:00:00.000Z',
  },
];
const DESIGNS = [{ id: 30, name: 'Window 532 AR' }];
const PEOPLE = [
  { id: 2, displayName: 'Mira Castell' },
  { id: 3, displayName: 'Tomas Reyes' },
];

describe('AuditGrid', () => {
  it('lists each step with the design name, the status change, who and the comment', async () => {
    mockApi({ 'GET /api/audit': { status: 200, body: EVENTS } });
    renderWithProviders(
      <AuditGrid filter={{}} onFilterChange={() => {}} designs={DESIGNS} people={PEOPLE} />,
    );
    const grid = await screen.findByRole('grid', { name: 'Audit trail' });
    await waitFor(() => expect(within(grid).getAllByRole('row')).toHaveLength(3));
    const cells = (row: number) =>
      within(within(grid).getAllByRole('row')[row])
        .getAllByRole('gridcell')
        .map((c) => c.textContent);
    expect(cells(1).slice(1)).toEqual([
      'Window 532 AR',
      '2',
      'submitted → returned',
      'Tomas Reyes',
      'Check 680 nm',
    ]);
    expect(cells(2).slice(3)).toEqual(['draft → submitted', 'Mira Castell', '—']);
    const link = within(grid).getAllByRole('link', { name: 'Window 532 AR' })[0];
    expect(link.getAttribute('href')).toBe('/designs/30?version=2');
    // No filter: the two choosers say so rather than showing blank.
    expect(screen.getByRole('combobox', { name: 'Design' }).textContent).toBe('All designs');
    expect(screen.getByRole('combobox', { name: 'Who' }).textContent).toBe('Everyone');
  });

  it('asks the API for one design and one person, and reports filter changes', async () => {
    const api = mockApi({ 'GET /api/audit?designId=30&actorId=3': { status: 200, body: [EVENTS[0]] } });
    const onFilterChange = vi.fn();
    const { user } = renderWithProviders(
      <AuditGrid
        filter={{ designId: 30, actorId: 3 }}
        onFilterChange={onFilterChange}
        designs={DESIGNS}
        people={PEOPLE}
      />,
    );
    const grid = await screen.findByRole('grid', { name: 'Audit trail' });
    await waitFor(() => expect(within(grid).getAllByRole('row')).toHaveLength(2));
    expect(api.unexpected).toEqual([]);

    await user.click(screen.getByRole('combobox', { name: 'Who' }));
    await user.click(await screen.findByRole('option', { name: 'Everyone' }));
    expect(onFilterChange).toHaveBeenCalledWith({ designId: 30, actorId: undefined });
  });
});
