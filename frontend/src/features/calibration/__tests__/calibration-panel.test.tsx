import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { ChamberCalibrationView } from '@quietglass/shared';
import { DEFAULT_CALIBRATION_SETTINGS, trackCalibration } from '@quietglass/shared';
import { apiError, mockApi } from '../../../test/mock-api';
import { tracesOf } from '../../../test/plot-mock';
import { renderWithProviders } from '../../../test/render';
import { CalibrationPanel } from '../components/calibration-panel';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

/** An invented chamber: ZrO2 runs 2 % thick over ten runs, the seventh an outlier. */
const VALUES = [1.019, 1.021, 1.02, 1.018, 1.022, 1.02, 1.06, 1.021, 1.019, 1.02];
const TRACKED = trackCalibration(VALUES.map((value) => ({ value, sigma: 0.002 })));
const layer = (factor: number, identified: boolean, designNm: number) => ({
  layer: 2,
  step: 3,
  designNm,
  fittedNm: designNm * factor,
  factor,
  factorSigma: identified ? 0.002 : 0.08,
  fitFactorSigma: identified ? 0.002 : 0.08,
  correlatedWith: null,
  identified,
  monitorThicknessNm: null,
  rateNmPerS: 0.41,
  impliedToolingFactor: identified ? 0.97 * factor : null,
});
const VIEW: ChamberCalibrationView = {
  chamberId: 7,
  settings: DEFAULT_CALIBRATION_SETTINGS,
  series: [
    {
      materialId: 4,
      materialName: 'ZrO2',
      currentToolingFactor: 0.97,
      runs: VALUES.map((v, i) => ({
        runId: 20 + i,
        lotNumber: `T-${i + 1}`,
        runDate: `2026-11-${String(i + 1).padStart(2, '0')}`,
        calculationId: 40 + i,
        toolingFactorInEffect: 0.97,
        layers: [layer(v, true, 120), layer(1.1, false, 3)],
        correction: { value: v, sigma: 0.002 },
        rateRatio: 1.025,
        cause: 'material' as const,
        tracked: TRACKED[i]!,
      })),
      estimate: {
        correction: { value: 1.0203, sigma: 0.0011 },
        driftPercentPerRun: { value: 0.02, sigma: 0.05 },
        suggestedToolingFactor: 0.9897,
        runs: 10,
      },
      rate: { ratio: { value: 1.025, sigma: 0.004 }, driftPercentPerRun: { value: 0, sigma: 0.1 }, runs: 10 },
    },
    {
      materialId: 5,
      materialName: 'TiO2',
      currentToolingFactor: 0.95,
      runs: [],
      estimate: null,
      rate: null,
    },
  ],
  suggestions: [
    {
      key: 'material|4|run24|tf0.97->0.9897',
      kind: 'material',
      materialIds: [4],
      correction: { value: 1.0203, sigma: 0.0011 },
      currentToolingFactor: 0.97,
      proposedToolingFactor: 0.9897,
      lastRunId: 24,
      message: 'ZrO2 layers come out thick by 2.03 % ± 0.11 % over 10 runs: tooling factor 0.97 → 0.9897',
    },
  ],
  decisions: [],
};

function traces(name: string) {
  return tracesOf(screen.getByRole('figure', { name })) as unknown as {
    name: string;
    x: string[];
    y: number[];
  }[];
}

describe('calibration panel', () => {
  it('shows the estimate per material and a control chart with the outlier marked', async () => {
    const api = mockApi({ 'GET /api/chambers/7/calibration': { status: 200, body: VIEW } });
    renderWithProviders(<CalibrationPanel chambers={[{ id: 7, name: 'Bell jar 1' }]} canDecide />);
    const table = await screen.findByRole('table', { name: 'Calibration estimates' }, { timeout: 10_000 });
    const rows = within(table)
      .getAllByRole('row')
      .map((r) => [...r.querySelectorAll('td, th')].map((c) => c.textContent));
    // Only materials with runs are listed; one 3 nm layer per run is left out.
    expect(rows.slice(1)).toEqual([
      ['ZrO2', '0.970', '+2.03 % ± 0.11 %', '+0.020 % ± 0.050 %', '10', '10', '1.025'],
    ]);
    const t = traces('Control chart Bell jar 1 ZrO2');
    const runs = t.find((x) => x.name === 'Runs (±1σ)')!;
    expect(runs.y.map((y) => Number(y.toFixed(6)))).toEqual([1.9, 2.1, 2, 1.8, 2.2, 2, 6, 2.1, 1.9, 2]);
    const out = t.find((x) => x.name === 'Out of control')!;
    expect(out.x).toEqual(['T-7 (2026-11-07)']);
    expect(t.find((x) => x.name === 'Estimate')!.y[9]).toBeCloseTo((TRACKED[9]!.estimate - 1) * 100, 9);
    expect(t.find((x) => x.name === 'Threshold ±1 %')!.y).toEqual([1, 1]);
    expect(api.unexpected).toEqual([]);
  });

  it('accepts the suggestion exactly as shown, with the comment', async () => {
    const api = mockApi({
      'GET /api/chambers/7/calibration': [
        { status: 200, body: VIEW },
        { status: 200, body: { ...VIEW, suggestions: [] } },
      ],
      'POST /api/chambers/7/calibration/decisions': { status: 201, body: { id: 1 } },
    });
    const { user } = renderWithProviders(
      <CalibrationPanel chambers={[{ id: 7, name: 'Bell jar 1' }]} canDecide />,
    );
    const region = await screen.findByRole(
      'region',
      { name: 'Suggested tooling factor ZrO2' },
      { timeout: 10_000 },
    );
    await user.click(within(region).getByRole('button', { name: 'Accept' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Accept the suggestion' }));
    expect(dialog.getByText(/becomes 0.9897 \(now 0.970\)/)).toBeTruthy();
    await user.click(dialog.getByRole('button', { name: 'Accept' }));
    expect(await dialog.findByText('Say why')).toBeTruthy();
    expect(api.calls('POST', '/api/chambers/7/calibration/decisions')).toEqual([]);
    await user.type(dialog.getByLabelText(/Comment/), '  Witness checked  ');
    await user.click(dialog.getByRole('button', { name: 'Accept' }));
    await waitFor(() => expect(api.calls('POST', '/api/chambers/7/calibration/decisions')).toHaveLength(1));
    expect(api.calls('POST', '/api/chambers/7/calibration/decisions')[0]!.body).toEqual({
      key: 'material|4|run24|tf0.97->0.9897',
      decision: 'accepted',
      comment: 'Witness checked',
    });
    expect(await screen.findByText(/No suggested correction/)).toBeTruthy();
  });

  it('shows why a rejection was refused and keeps the dialog open', async () => {
    mockApi({
      'GET /api/chambers/7/calibration': { status: 200, body: VIEW },
      'POST /api/chambers/7/calibration/decisions': apiError(
        409,
        'Conflict',
        'This suggestion is no longer current (a new run or a changed tooling factor); reload the calibration',
      ),
    });
    const { user } = renderWithProviders(
      <CalibrationPanel chambers={[{ id: 7, name: 'Bell jar 1' }]} canDecide />,
    );
    const region = await screen.findByRole(
      'region',
      { name: 'Suggested tooling factor ZrO2' },
      { timeout: 10_000 },
    );
    await user.click(within(region).getByRole('button', { name: 'Reject' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Reject the suggestion' }));
    await user.type(dialog.getByLabelText(/Comment/), 'Crucible changed');
    await user.click(dialog.getByRole('button', { name: 'Reject' }));
    expect(await dialog.findByText(/no longer current/)).toBeTruthy();
  });

  it('offers no decision to an operator', async () => {
    mockApi({ 'GET /api/chambers/7/calibration': { status: 200, body: VIEW } });
    renderWithProviders(<CalibrationPanel chambers={[{ id: 7, name: 'Bell jar 1' }]} canDecide={false} />);
    const region = await screen.findByRole(
      'region',
      { name: 'Suggested tooling factor ZrO2' },
      { timeout: 10_000 },
    );
    expect(within(region).queryByRole('button')).toBeNull();
    expect(screen.getByText(/Engineers and administrators accept or reject/)).toBeTruthy();
  });
});
