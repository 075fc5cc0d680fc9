import { screen, waitFor, within } from '@testing-library/react';
import type { DesignVersionView, FitResult, GrowResult, LimitBand, YieldForecast } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { tracesOf } from '../../../test/plot-mock';
import { apiError, mockApi, type MockResponse } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { testCalculation } from '../../../test/calculation-fixtures';
import { TEST_MATERIALS, testVersion } from '../../../test/design-fixtures';
import type { CalculationView } from '../api/get-calculation';
import { OptimisePanel } from '../components/optimise-panel';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

/*
 * Answers follow the compute-queue API: POST …/fit|grow|yield → 201 queued (200 reused); GET
 * /calculations/:id polled with progress and live.history; POST /calculations/:id/cancel; POST
 * /calculations/:id/accept → the new draft version. Summaries are invented fixtures in the shapes
 * of the engine's FitResult, GrowResult and YieldForecast.
 */

const POLL = 'GET /api/calculations/7';

/** Quarter wave of MgF2 (n 1.38) at 550 nm: 550 / (4 · 1.38) nm. */
const QUARTER_WAVE_MGF2_NM = 550 / (4 * 1.38);
/** Half wave: an absentee layer at 550 nm. */
const HALF_WAVE_MGF2_NM = 2 * QUARTER_WAVE_MGF2_NM;

/** R ≤ 1.5 % over 500–600 nm at normal incidence (invented). */
const MASK: LimitBand[] = [
  { from_nm: 500, to_nm: 600, quantity: 'R', max_percent: 1.5, angles_deg: [0], polarisation: 'avg' },
];

/** One MgF2 layer on the test glass (n 1.52), starting as a half wave. */
const ONE_LAYER = testVersion({
  layers: [{ materialId: 4, thicknessNm: HALF_WAVE_MGF2_NM, locked: false, notes: '' }],
});

/** TiO2 then MgF2 (incident side first), for Grow layers. */
const TWO_LAYERS = testVersion({
  layers: [
    { materialId: 4, thicknessNm: 90, locked: false, notes: '' },
    { materialId: 5, thicknessNm: 30, locked: false, notes: '' },
  ],
});

const FIT: FitResult = {
  thicknessesNm: [QUARTER_WAVE_MGF2_NM],
  initialThicknessesNm: [HALF_WAVE_MGF2_NM],
  merit: { before: 2.7581, after: 0.1234 },
  pass: true,
  worstMargin: 0.084,
  targetMarginPercent: 0.1,
  iterations: 6,
  evaluations: 14,
  history: [
    { iteration: 0, merit: 2.7581 },
    { iteration: 6, merit: 0.1234 },
  ],
  converged: true,
  stoppedBy: 'converged',
  forecast: {
    trials: 500,
    requestedTrials: 500,
    relativePercent: 1,
    yieldFraction: 0.874,
    medianWorstMargin: 0.0521,
    p5WorstMargin: -0.0132,
  },
};

function calc(overrides: Partial<CalculationView>): CalculationView {
  return { ...testCalculation(), kind: 'fit', request: {}, ...overrides };
}

/** A poll answer the test can change while the panel polls. */
function changing(initial: CalculationView) {
  let current = initial;
  return {
    handler: (): MockResponse => ({ status: 200, body: current }),
    set: (next: CalculationView) => {
      current = next;
    },
  };
}

/** The panel on saved version 1 of design 12, as the design workspace page loads it. */
function renderPanel(version: DesignVersionView | undefined, onVersionChange = vi.fn(), canRun = true) {
  const storeVersion = vi.fn(async (_view: DesignVersionView) => {});
  const view = renderWithProviders(
    <OptimisePanel
      designId={12}
      versionNumber={1}
      version={{ data: version, isPending: version === undefined, isError: false, error: null }}
      library={TEST_MATERIALS}
      maskBands={MASK}
      canRun={canRun}
      onVersionChange={onVersionChange}
      storeVersion={storeVersion}
      pollMs={40}
    />,
  );
  return { ...view, onVersionChange, storeVersion };
}

function region() {
  return within(screen.getByRole('region', { name: 'Optimise' }));
}

/** The y value of a trace at the x closest to `x`. */
function valueAt(trace: Record<string, unknown>, x: number): number {
  const xs = trace.x as number[];
  const ys = trace.y as number[];
  let best = 0;
  xs.forEach((v, i) => {
    if (Math.abs(v - x) < Math.abs(xs[best]! - x)) best = i;
  });
  return ys[best]!;
}

describe('OptimisePanel — Fit to mask', () => {
  it('refuses a min thickness above the max, and iterations and margin out of range, without queuing', async () => {
    const api = mockApi({});
    const { user } = renderPanel(ONE_LAYER);
    const min = await screen.findByLabelText('Min thickness (nm)');
    await user.clear(min);
    await user.type(min, '300');
    await user.clear(screen.getByLabelText('Max thickness (nm)'));
    await user.type(screen.getByLabelText('Max thickness (nm)'), '200');
    await user.clear(screen.getByLabelText('Max iterations'));
    await user.type(screen.getByLabelText('Max iterations'), '5000');
    await user.clear(screen.getByLabelText('Target margin (pp)'));
    await user.type(screen.getByLabelText('Target margin (pp)'), '6');
    await user.click(screen.getByRole('button', { name: 'Run Fit to mask' }));

    expect(await region().findByText('Max thickness must not be below min thickness (300 nm)')).toBeTruthy();
    expect(region().getByText('Max iterations must be a whole number from 1 to 1000')).toBeTruthy();
    // The shop setting's own message for a margin out of range.
    expect(region().getByText('A number from 0 to 5 percentage points')).toBeTruthy();
    expect(api.calls('POST', '/api/designs/12/versions/1/fit')).toHaveLength(0);
  });

  it('shows the API refusal of a request', async () => {
    mockApi({
      'POST /api/designs/12/versions/1/fit': apiError(
        400,
        'Bad Request',
        'every layer is locked: unlock at least one layer to fit',
      ),
    });
    const { user } = renderPanel(ONE_LAYER);
    await user.click(await screen.findByRole('button', { name: 'Run Fit to mask' }));
    const alert = await region().findByRole('alert');
    expect(alert.textContent).toContain('Fit to mask was not queued');
    expect(alert.textContent).toContain('every layer is locked: unlock at least one layer to fit');
  });

  it('streams the merit while it runs, then shows the thicknesses and spectra, and accepts as a new draft', async () => {
    const poll = changing(
      calc({
        status: 'running',
        progress: 0.3,
        live: {
          history: [
            { iteration: 0, merit: 2.7581 },
            { iteration: 1, merit: 1.402 },
            { iteration: 2, merit: 0.611 },
          ],
        },
      }),
    );
    const api = mockApi({
      'POST /api/designs/12/versions/1/fit': { status: 201, body: { ...calc({}), reused: false } },
      [POLL]: poll.handler,
      'GET /api/calculations': { status: 200, body: [] },
      'POST /api/calculations/7/accept': { status: 201, body: testVersion({ number: 2, layers: [] }) },
    });
    const { user, onVersionChange, storeVersion } = renderPanel(ONE_LAYER);
    await user.click(await screen.findByRole('button', { name: 'Run Fit to mask' }));

    const bar = await region().findByRole('progressbar', { name: 'Fit to mask progress' });
    await waitFor(() => expect(bar.getAttribute('aria-valuenow')).toBe('30'));
    expect(api.calls('POST', '/api/designs/12/versions/1/fit').map((r) => r.body)).toEqual([
      { minThicknessNm: 10, maxThicknessNm: 1000, maxIterations: 100, targetMarginPercent: 0.1 },
    ]);
    await waitFor(() =>
      expect(region().getByLabelText('Latest merit').textContent).toBe(
        'Merit 0.6110 at iteration 2 (3 points)',
      ),
    );
    const merit = tracesOf(region().getByRole('figure', { name: 'Merit so far' }))[0]!;
    expect(merit.x).toEqual([0, 1, 2]);
    expect(merit.y).toEqual([2.7581, 1.402, 0.611]);

    poll.set(calc({ status: 'completed', progress: 1, summary: FIT as unknown as Record<string, unknown> }));
    const table = await region().findByRole('table', { name: 'Thicknesses before and after' });
    const cells = within(table).getAllByRole('row')[1]!.querySelectorAll('td');
    expect([...cells].map((c) => c.textContent)).toEqual(['1', 'MgF2', '199.28', '99.64', '−99.64']);
    expect(region().getByRole('group', { name: 'Fit to mask result' }).textContent).toBe(
      'PassMerit 2.7581 → 0.1234 percentage points · worst margin +0.084 percentage points, target +0.100 not reached · 6 iterations (converged)',
    );
    expect(region().getByRole('status', { name: 'Forecast yield of the result' }).textContent).toBe(
      'Forecast yield 87.4 % at 1 % (1σ) thickness error per layer, 500 trials · worst margin median +0.052, 5th percentile −0.013 percentage points. Run a Yield forecast of the accepted version for systematic and index errors.',
    );
    expect(region().queryByRole('progressbar', { name: 'Fit to mask progress' })).toBeNull();
    const history = tracesOf(region().getByRole('figure', { name: 'Merit per iteration' }))[0]!;
    expect([history.x, history.y]).toEqual([
      [0, 6],
      [2.7581, 0.1234],
    ]);

    // Spectra computed in place: a half-wave layer is absentee (R of bare n 1.52 glass, 4.258 %);
    // a quarter wave of n 1.38 gives R = ((1.52 − 1.38²)/(1.52 + 1.38²))² = 1.2601 % at 550 nm
    // (Macleod, Thin-Film Optical Filters, ch. 2).
    const overlay = await region().findByRole('figure', { name: 'Reflectance before and after' });
    const traces = tracesOf(overlay);
    expect(traces.map((t) => t.name)).toEqual(['Before 0°', 'After 0°']);
    expect(valueAt(traces[0]!, 550)).toBeCloseTo(4.258, 2);
    expect(valueAt(traces[1]!, 550)).toBeCloseTo(1.2601, 3);

    await user.click(region().getByRole('button', { name: 'Accept as new draft' }));
    await waitFor(() => expect(onVersionChange).toHaveBeenCalledWith(2));
    expect(api.calls('POST', '/api/calculations/7/accept').map((r) => r.body)).toEqual([{}]);
    // The new draft was handed to the page to cache before it was opened.
    expect(storeVersion.mock.calls.map(([v]) => v.number)).toEqual([2]);
  });

  it("starts the target margin at the shop's default and sends what the engineer types", async () => {
    const api = mockApi({
      'GET /api/shop-settings': {
        status: 200,
        body: { shopName: 'Larkspur', logo: null, targetMarginPercent: 0.3, version: 2, updatedAt: null },
      },
      'POST /api/designs/12/versions/1/fit': { status: 201, body: { ...calc({}), reused: false } },
      [POLL]: { status: 200, body: calc({ status: 'queued' }) },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel(ONE_LAYER);
    const margin = (await screen.findByLabelText('Target margin (pp)')) as HTMLInputElement;
    await waitFor(() => expect(margin.value).toBe('0.3'));
    expect(screen.getByText('Inside every limit; shop default 0.3')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Run Fit to mask' }));
    await waitFor(() => expect(api.calls('POST', '/api/designs/12/versions/1/fit')).toHaveLength(1));
    expect(api.calls('POST', '/api/designs/12/versions/1/fit')[0]!.body).toMatchObject({
      targetMarginPercent: 0.3,
    });
  });

  it('cancels a running fit', async () => {
    const poll = changing(calc({ status: 'running', progress: 0.2 }));
    const api = mockApi({
      'POST /api/designs/12/versions/1/fit': {
        status: 201,
        body: { ...calc({ status: 'running', progress: 0.2 }), reused: false },
      },
      [POLL]: poll.handler,
      'GET /api/calculations': { status: 200, body: [] },
      'POST /api/calculations/7/cancel': () => {
        const cancelled = calc({ status: 'cancelled', error: 'Cancelled by the user' });
        poll.set(cancelled);
        return { status: 201, body: cancelled };
      },
    });
    const { user } = renderPanel(ONE_LAYER);
    await user.click(await screen.findByRole('button', { name: 'Run Fit to mask' }));
    await region().findByRole('progressbar', { name: 'Fit to mask progress' });
    await user.click(region().getByRole('button', { name: 'Cancel' }));

    await waitFor(() =>
      expect(region().getByRole('status', { name: 'Fit to mask status' }).textContent).toBe(
        'Fit to mask (calculation 7) was cancelled',
      ),
    );
    expect(region().getByText('Cancelled by the user')).toBeTruthy();
    expect(api.calls('POST', '/api/calculations/7/cancel')).toHaveLength(1);
    expect(region().queryByRole('button', { name: 'Cancel' })).toBeNull();
  });
});

const GROW: GrowResult = {
  steps: [
    {
      step: 0,
      layerCount: 2,
      totalThicknessNm: 120,
      merit: 0.91,
      pass: false,
      worstMargin: -0.42,
      layers: [
        { material: 'MgF2', thicknessNm: 95.5 },
        { material: 'TiO2', thicknessNm: 28.25 },
      ],
    },
    {
      step: 1,
      layerCount: 4,
      totalThicknessNm: 260.5,
      merit: 0.05,
      pass: true,
      worstMargin: 0.11,
      layers: [
        { material: 'MgF2', thicknessNm: 96 },
        { material: 'TiO2', thicknessNm: 110 },
        { material: 'MgF2', thicknessNm: 24.5 },
        { material: 'TiO2', thicknessNm: 30 },
      ],
      inserted: { material: 'MgF2', depthNm: 150 },
    },
  ],
  final: {} as GrowResult['final'],
  stack: {} as GrowResult['stack'],
  stoppedBy: 'maskMet',
};
GROW.final = GROW.steps[1]!;

describe('OptimisePanel — Grow layers', () => {
  it('asks for at least one allowed material', async () => {
    const api = mockApi({});
    const { user } = renderPanel(TWO_LAYERS);
    await user.click(await screen.findByRole('tab', { name: 'Grow layers' }));
    // The version's materials are ticked at first; its incident medium and substrate are not offered.
    const group = within(await region().findByRole('group', { name: 'Allowed materials' }));
    const mgf2 = group.getByRole('checkbox', { name: 'MgF2' });
    expect(group.getAllByRole('checkbox').map((c) => c.closest('label')?.textContent)).toEqual([
      'MgF2',
      'TiO2',
    ]);
    const tio2 = group.getByRole('checkbox', { name: 'TiO2' });
    expect([(mgf2 as HTMLInputElement).checked, (tio2 as HTMLInputElement).checked]).toEqual([true, true]);
    await user.click(mgf2);
    await user.click(tio2);
    await user.clear(region().getByLabelText('Max layers'));
    await user.type(region().getByLabelText('Max layers'), '1');
    await user.click(region().getByRole('button', { name: 'Run Grow layers' }));

    expect(await region().findByText('Choose at least one material')).toBeTruthy();
    expect(region().getByText('Max layers must be a whole number from 2 to 200')).toBeTruthy();
    expect(api.calls('POST', '/api/designs/12/versions/1/grow')).toHaveLength(0);
  });

  it('grows on the mask merit when chosen, with the needles per step typed', async () => {
    const api = mockApi({
      'POST /api/designs/12/versions/1/grow': {
        status: 201,
        body: { ...calc({ kind: 'grow' }), reused: false },
      },
      [POLL]: { status: 200, body: calc({ kind: 'grow' }) },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel(TWO_LAYERS);
    await user.click(await screen.findByRole('tab', { name: 'Grow layers' }));
    await user.selectOptions(await region().findByLabelText('Grow on'), 'The spec mask');
    const needles = region().getByLabelText('Needles per step');
    await user.clear(needles);
    await user.type(needles, '11');
    await user.click(region().getByRole('button', { name: 'Run Grow layers' }));
    expect(await region().findByText('Needles per step must be a whole number from 1 to 10')).toBeTruthy();
    expect(api.calls('POST', '/api/designs/12/versions/1/grow')).toHaveLength(0);

    await user.clear(needles);
    await user.type(needles, '5');
    await user.click(region().getByRole('button', { name: 'Run Grow layers' }));
    await waitFor(() => expect(api.calls('POST', '/api/designs/12/versions/1/grow')).toHaveLength(1));
    expect(api.calls('POST', '/api/designs/12/versions/1/grow')[0]!.body).toMatchObject({
      growthMerit: 'mask',
      needlesPerStep: 5,
    });
  });

  it('shows the progression, lets a step be chosen and accepts that step', async () => {
    const done = calc({
      kind: 'grow',
      status: 'completed',
      progress: 1,
      summary: GROW as unknown as Record<string, unknown>,
    });
    const api = mockApi({
      'POST /api/designs/12/versions/1/grow': {
        status: 201,
        body: { ...calc({ kind: 'grow' }), reused: false },
      },
      [POLL]: { status: 200, body: done },
      'GET /api/calculations': { status: 200, body: [] },
      'POST /api/calculations/7/accept': { status: 201, body: testVersion({ number: 3 }) },
    });
    const { user, onVersionChange, storeVersion } = renderPanel(TWO_LAYERS);
    await user.click(await screen.findByRole('tab', { name: 'Grow layers' }));
    const outermost = within(await region().findByRole('group', { name: 'Only as the outermost layer' }));
    await user.click(outermost.getByRole('checkbox', { name: 'MgF2' }));
    await user.click(await region().findByRole('button', { name: 'Run Grow layers' }));

    const progression = await region().findByRole('figure', { name: 'Merit against layer count' });
    const trace = tracesOf(progression)[0]!;
    expect(trace.x).toEqual([2, 4]);
    expect(trace.y).toEqual([0.91, 0.05]);
    expect(api.calls('POST', '/api/designs/12/versions/1/grow').map((r) => r.body)).toEqual([
      {
        allowedMaterialIds: [4, 5],
        outermostOnlyMaterialIds: [4],
        maxLayers: 30,
        maxTotalThicknessNm: 5000,
        minThicknessNm: 10,
        maxThicknessNm: 1000,
        maxSteps: 30,
        targetMarginPercent: 0.1,
        growthMerit: 'smooth',
        needlesPerStep: 3,
      },
    ]);

    // The final step at first: four layers against the version's two, paired by identity (the
    // pairing that keeps both layers and changes them least); the two inserted ones are new.
    const rows = () =>
      within(region().getByRole('table', { name: 'Thicknesses before and after' }))
        .getAllByRole('row')
        .slice(1)
        .map((r) => [...r.querySelectorAll('td')].map((c) => c.textContent));
    expect(rows()).toEqual([
      ['1', 'MgF2', '90.00', '96.00', '+6.00'],
      ['2new', 'TiO2', '—', '110.00', '—'],
      ['3new', 'MgF2', '—', '24.50', '—'],
      ['4', 'TiO2', '30.00', '30.00', '+0.00'],
    ]);
    await user.click(region().getByRole('radio', { name: 'Step 0' }));
    expect(rows()).toEqual([
      ['1', 'MgF2', '90.00', '95.50', '+5.50'],
      ['2', 'TiO2', '30.00', '28.25', '−1.75'],
    ]);
    expect(await region().findByRole('figure', { name: 'Reflectance before and after' })).toBeTruthy();

    await user.click(region().getByRole('button', { name: 'Accept as new draft' }));
    await waitFor(() => expect(onVersionChange).toHaveBeenCalledWith(3));
    expect(api.calls('POST', '/api/calculations/7/accept').map((r) => r.body)).toEqual([{ step: 0 }]);
    expect(storeVersion.mock.calls.map(([v]) => v.number)).toEqual([3]);
  });
});

const FORECAST: YieldForecast = {
  trials: 200,
  requestedTrials: 200,
  seed: 1,
  passed: 175,
  yieldFraction: 0.875,
  stoppedBy: 'completed',
  nominal: { pass: true, worstMargin: 0.12 },
  worstMargins: {
    mean: 0.05,
    min: -0.3,
    max: 0.12,
    percentiles: [
      { p: 5, value: -0.1 },
      { p: 50, value: 0.06 },
      { p: 95, value: 0.11 },
    ],
    histogram: { edges: [-0.3, -0.1, 0.1, 0.3], counts: [10, 150, 40] },
  },
  envelopes: [
    {
      quantity: 'R',
      angleDeg: 0,
      polarisation: 'avg',
      wavelengthsNm: [500, 550, 600],
      nominal: [1.2, 1.1, 1.3],
      percentiles: [
        { p: 5, values: [1.0, 0.9, 1.1] },
        { p: 50, values: [1.2, 1.1, 1.3] },
        { p: 95, values: [1.6, 1.4, 1.7] },
      ],
    },
  ],
  envelopeTrials: 200,
  sensitivity: [
    { layer: 1, material: 'TiO2', yieldLossFraction: 0.08, marginLossPercent: 0.061 },
    { layer: 0, material: 'MgF2', yieldLossFraction: 0.02, marginLossPercent: 0.015 },
  ],
  sensitivityTrials: 200,
};

describe('OptimisePanel — Yield forecast', () => {
  it('refuses trials out of range', async () => {
    const api = mockApi({});
    const { user } = renderPanel(TWO_LAYERS);
    await user.click(await screen.findByRole('tab', { name: 'Yield forecast' }));
    const trials = await region().findByLabelText('Trials');
    await user.clear(trials);
    await user.type(trials, '200000');
    await user.clear(region().getByLabelText('Thickness error (%)'));
    await user.type(region().getByLabelText('Thickness error (%)'), '-1');
    await user.click(region().getByRole('button', { name: 'Run Yield forecast' }));
    expect(await region().findByText('Trials must be a whole number from 1 to 100000')).toBeTruthy();
    expect(region().getByText('The thickness error must be a number from 0 to 50 %')).toBeTruthy();
    expect(api.calls('POST', '/api/designs/12/versions/1/yield')).toHaveLength(0);
  });

  it('shows the yield, the envelope with the mask, the histogram and the sensitivity ranking', async () => {
    const done = calc({
      kind: 'yield',
      status: 'completed',
      progress: 1,
      summary: FORECAST as unknown as Record<string, unknown>,
    });
    const api = mockApi({
      'POST /api/designs/12/versions/1/yield': { status: 201, body: { ...done, reused: false } },
      [POLL]: { status: 200, body: done },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel(TWO_LAYERS);
    await user.click(await screen.findByRole('tab', { name: 'Yield forecast' }));
    const trials = await region().findByLabelText('Trials');
    await user.clear(trials);
    await user.type(trials, '200');
    await user.click(region().getByRole('button', { name: 'Run Yield forecast' }));

    expect((await region().findByLabelText('Predicted yield')).textContent).toBe('Predicted yield 87.5 %');
    expect(api.calls('POST', '/api/designs/12/versions/1/yield').map((r) => r.body)).toEqual([
      {
        trials: 200,
        seed: 1,
        thickness: { relativePercent: 1, absoluteNm: 0, distribution: 'normal' },
        systematicPercent: 0,
        indexPercent: 0,
      },
    ]);
    const envelope = region().getByRole('figure', { name: 'Percentile envelope R at 0° (avg)' });
    const traces = tracesOf(envelope);
    expect(traces.map((t) => t.name)).toEqual(['5 %', '50 %', '95 %', 'Nominal']);
    expect(traces[2]!.y).toEqual([1.6, 1.4, 1.7]);
    const bars = tracesOf(region().getByRole('figure', { name: 'Worst margins of the trials' }))[0]!;
    expect(bars.x).toEqual([-0.2, 0, 0.2].map((v) => expect.closeTo(v, 12) as number));
    expect(bars.y).toEqual([10, 150, 40]);
    const ranking = within(region().getByRole('table', { name: 'Layer sensitivity' }))
      .getAllByRole('row')
      .slice(1)
      .map((r) => [...r.querySelectorAll('td')].map((c) => c.textContent));
    expect(ranking).toEqual([
      ['1', '2', 'TiO2', '8.0', '0.061'],
      ['2', '1', 'MgF2', '2.0', '0.015'],
    ]);
  });
});

describe('OptimisePanel — roles', () => {
  it('is not shown to a role that cannot run optimisations, and fetches nothing', () => {
    const api = mockApi({});
    renderPanel(undefined, vi.fn(), false);
    expect(screen.queryByRole('region', { name: 'Optimise' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Run Fit to mask' })).toBeNull();
    expect(api.requests).toHaveLength(0);
  });
});
