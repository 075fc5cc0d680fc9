import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { testCalculation } from '../../../test/calculation-fixtures';
import type { CalculationView } from '../api/get-calculation';
import { ComputeQueueGrid } from '../components/compute-queue-grid';

// Answers: GET /calculations (latest 100, newest first) and POST /calculations/:id/cancel of the
// design-workspace API contract.

function calc(id: number, status: CalculationView['status'], progress: number): CalculationView {
  return testCalculation({
    id,
    status,
    progress,
    startedAt: status === 'queued' ? null : '2026-12-01T09:00:02.500Z',
    finishedAt: status === 'completed' ? '2026-12-01T09:00:04.000Z' : null,
    computeMs: status === 'completed' ? 1420 : null,
    attempts: 1,
  });
}

/** A Fit to mask job: its request and summary are not an analysis's. */
const FIT: CalculationView = {
  ...testCalculation({ id: 6, status: 'completed', progress: 1 }),
  kind: 'fit',
  request: { maxIterations: 40 },
  summary: { merit: 0.12 },
};

function rowOf(id: number): HTMLElement {
  const grid = screen.getByRole('grid', { name: 'Compute queue' });
  const row = within(grid)
    .getAllByRole('row')
    .find((r) => within(r).queryAllByRole('gridcell')[0]?.textContent === String(id));
  if (!row) throw new Error(`no row for calculation ${id}`);
  return row;
}

describe('ComputeQueueGrid', () => {
  it('lists calculations with status, progress, design, timings and Cancel for live ones only', async () => {
    const api = mockApi({
      'GET /api/calculations': [
        { status: 200, body: [calc(9, 'running', 0.5), calc(8, 'queued', 0), calc(7, 'completed', 1), FIT] },
        {
          status: 200,
          body: [calc(9, 'cancelled', 0.5), calc(8, 'queued', 0), calc(7, 'completed', 1), FIT],
        },
      ],
      'POST /api/calculations/9/cancel': { status: 201, body: calc(9, 'cancelled', 0.5) },
    });
    const { user } = renderWithProviders(
      <ComputeQueueGrid designNames={new Map([[12, 'Lens AR trial']])} canCancel pollMs={60_000} />,
    );

    await waitFor(() => expect(rowOf(9)).toBeTruthy());
    const running = within(rowOf(9));
    expect(running.getByText('running')).toBeTruthy();
    expect(
      running.getByRole('progressbar', { name: 'Progress of calculation 9' }).getAttribute('aria-valuenow'),
    ).toBe('50');
    expect(running.getByRole('link', { name: 'Lens AR trial · v1' }).getAttribute('href')).toBe(
      '/designs/12?version=1',
    );
    expect(running.getByText('400–800 nm × 401, 0–60° × 13')).toBeTruthy();
    const done = within(rowOf(7));
    expect(done.getByText('1.42 s')).toBeTruthy();
    // Waited from queued (09:00:00) to started (09:00:02.5).
    expect(done.getByText('2.5 s')).toBeTruthy();
    expect(done.queryByRole('button', { name: /Cancel/ })).toBeNull();
    expect(within(rowOf(8)).getByRole('button', { name: 'Cancel calculation 8' })).toBeTruthy();
    expect(running.getByText('Full analysis')).toBeTruthy();
    const fit = within(rowOf(6));
    expect(fit.getByText('Fit to mask')).toBeTruthy();
    // No analysis grid to describe for an optimisation.
    expect(rowOf(6).textContent).not.toMatch(/nm ×/);

    await user.click(running.getByRole('button', { name: 'Cancel calculation 9' }));
    await waitFor(() => expect(within(rowOf(9)).getByText('cancelled')).toBeTruthy());
    expect(api.calls('POST', '/api/calculations/9/cancel')).toHaveLength(1);
    expect(within(rowOf(9)).queryByRole('button', { name: /Cancel/ })).toBeNull();
  });
});
