import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { RunDiagnosisPanel } from '../components/run-diagnosis-panel';

// API contract: POST /runs/:id/spectra/:spectrumId/diagnosis {factorRange} queues Run diagnosis on
// the compute queue (201, the calculation with `reused`); GET /calculations/:id is polled until it
// is done. Invented scenario: witness spectrum 31 of run 40, which built a four-layer recipe (design
// layer 1 outermost: MgF2 / ZrO2 / Al2O3 / SiO2); thicknesses are demo numbers only.

const SPECTRUM = { id: 31, runId: 40, filename: 'witness-118.csv' };
const MATERIALS: Record<number, string> = { 10: 'MgF2', 11: 'ZrO2', 12: 'Al2O3', 13: 'SiO2' };

function renderPanel() {
  return renderWithProviders(
    <RunDiagnosisPanel
      spectrum={SPECTRUM}
      layerCount={4}
      materialName={(id) => MATERIALS[id] ?? `Material ${id}`}
    />,
  );
}

describe('Run diagnosis', () => {
  const completed = {
    id: 77,
    kind: 'diagnosis',
    status: 'completed',
    progress: 1,
    error: null,
    designId: 12,
    versionNumber: 1,
    request: null,
    live: null,
    runId: 40,
    createdBy: 'Tomas Reyne',
    createdAt: '2026-12-01T13:00:00.000Z',
    startedAt: '2026-12-01T13:00:01.000Z',
    finishedAt: '2026-12-01T13:00:03.000Z',
    computeMs: 2000,
    processedBy: 'worker-1',
    attempts: 1,
    // Ranked by |deviation| as the worker sends it; factor = fitted ÷ design.
    summary: {
      residualRmsPercent: 0.0123,
      layers: [
        { layer: 2, materialId: 11, designNm: 127.6, fittedNm: 117.392, factor: 0.92, deviationPercent: -8 },
        { layer: 4, materialId: 13, designNm: 76.2, fittedNm: 78.105, factor: 1.025, deviationPercent: 2.5 },
        { layer: 1, materialId: 10, designNm: 96.8, fittedNm: 97.284, factor: 1.005, deviationPercent: 0.5 },
        { layer: 3, materialId: 12, designNm: 84.2, fittedNm: 84.116, factor: 0.999, deviationPercent: -0.1 },
      ],
    },
  };

  it('queues with the factor range, shows progress, then the ranked table with deviated layers highlighted', async () => {
    const calls = mockApi({
      'POST /api/runs/40/spectra/31/diagnosis': {
        status: 201,
        body: { ...completed, status: 'running', progress: 0.25, summary: null, reused: false },
      },
      'GET /api/calculations/77': [
        { status: 200, body: { ...completed, status: 'running', progress: 0.5, summary: null } },
        { status: 200, body: completed },
      ],
    });
    const { user } = renderPanel();
    const panel = within(screen.getByRole('region', { name: 'Run diagnosis' }));

    await user.clear(panel.getByLabelText('Lowest factor'));
    await user.type(panel.getByLabelText('Lowest factor'), '0.8');
    await user.clear(panel.getByLabelText('Highest factor'));
    await user.type(panel.getByLabelText('Highest factor'), '1.2');
    await user.click(panel.getByRole('button', { name: 'Run diagnosis' }));

    expect((await panel.findByRole('status', { name: 'Diagnosis status' })).textContent).toMatch(/Running/);
    expect(panel.getByRole('progressbar', { name: 'Diagnosis progress' })).toBeTruthy();
    await waitFor(
      () =>
        expect(panel.getByRole('status', { name: 'Diagnosis status' }).textContent).toBe(
          'Diagnosis completed',
        ),
      { timeout: 10_000 },
    );
    expect(calls.calls('POST', '/api/runs/40/spectra/31/diagnosis').map((r) => r.body)).toEqual([
      { factorRange: [0.8, 1.2] },
    ]);

    const table = within(panel.getByRole('table', { name: 'Fitted thickness factors' }));
    const rows = table.getAllByRole('row').slice(1);
    expect(
      rows.map((r) =>
        within(r)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      ),
    ).toEqual([
      ['1', '2', '3', 'ZrO2', '127.6', '117.4', '0.920', '−8.00 %', 'Likely deviated'],
      ['2', '4', '1', 'SiO2', '76.2', '78.1', '1.025', '+2.50 %', 'Likely deviated'],
      ['3', '1', '4', 'MgF2', '96.8', '97.3', '1.005', '+0.50 %', ''],
      ['4', '3', '2', 'Al2O3', '84.2', '84.1', '0.999', '−0.10 %', ''],
    ]);
    expect(panel.getByRole('status', { name: 'Diagnosis finding' }).textContent).toContain(
      'Most likely deviated: layer 2 (ZrO2, −8.00 %), layer 4 (SiO2, +2.50 %).',
    );
  });

  it('refuses a factor range with high ≤ low before sending', async () => {
    const calls = mockApi({});
    const { user } = renderPanel();
    const panel = within(screen.getByRole('region', { name: 'Run diagnosis' }));
    await user.clear(panel.getByLabelText('Highest factor'));
    await user.type(panel.getByLabelText('Highest factor'), '0.6');
    await user.click(panel.getByRole('button', { name: 'Run diagnosis' }));
    expect(await panel.findByText('The highest factor must exceed the lowest factor')).toBeTruthy();
    await user.clear(panel.getByLabelText('Lowest factor'));
    await user.type(panel.getByLabelText('Lowest factor'), '0');
    await user.click(panel.getByRole('button', { name: 'Run diagnosis' }));
    expect(await panel.findByText('The lowest factor must be a number above 0')).toBeTruthy();
    expect(calls.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });
});
