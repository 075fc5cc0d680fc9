import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { layoutOf, tracesOf } from '../../../test/plot-mock';
import { mockApi, type MockResponse } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { TEST_ANALYSIS_REQUEST, testCalculation } from '../../../test/calculation-fixtures';
import type { AnalysisCalculationView, CalculationView } from '../api/get-calculation';
import { AnalysisPanel } from '../components/analysis-panel';
import { AnalysisResults } from '../components/analysis-results';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Answers: the Compute queue endpoints of the design-workspace API contract (POST …/analysis →
// 201 queued or 200 reused; GET /calculations/:id polled for progress; GET …/result with
// values[iAngle][iWavelength] as fractions; POST /calculations/:id/cancel).

const SUBMIT = 'POST /api/designs/12/versions/1/analysis';
const POLL = 'GET /api/calculations/7';
const RESULT = 'GET /api/calculations/7/result?quantity=R&polarisation=avg';

const REQUEST = TEST_ANALYSIS_REQUEST;
const calculation = testCalculation;

const SUMMARY = {
  wavelengthsNm: [500, 550, 600],
  anglesDeg: [0, 30],
  polarisations: ['s', 'p', 'avg'] as const,
  colour: [
    { angleDeg: 0, L: 4.5, a: 2.1, b: -6.3, x: 0.27, y: 0.25, Rv: 0.005 },
    { angleDeg: 30, L: 5.1, a: 1.2, b: -4.0, x: 0.28, y: 0.27, Rv: 0.0062 },
  ],
  field: {
    wavelengthNm: 550,
    angleDeg: 0,
    depthsNm: [-10, 0, 50, 100],
    s: [1, 0.9, 1.1, 1],
    p: [1, 0.9, 1.1, 1],
    interfacesNm: [0, 100],
  },
  warnings: [],
};

const COMPLETED = calculation({
  status: 'completed',
  progress: 1,
  summary: SUMMARY,
  startedAt: '2026-12-01T09:00:01.000Z',
  finishedAt: '2026-12-01T09:00:02.000Z',
  computeMs: 840,
});

const RESULT_BODY = {
  wavelengthsNm: [500, 550, 600],
  anglesDeg: [0, 30],
  quantity: 'R',
  polarisation: 'avg',
  values: [
    [0.004, 0.002, 0.003],
    [0.005, 0.0031, 0.0042],
  ],
};

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

function renderPanel() {
  return renderWithProviders(<AnalysisPanel designId={12} versionNumber={1} canSubmit pollMs={40} />);
}

describe('AnalysisPanel', () => {
  it('starts on the range that covers every band of the mask', () => {
    mockApi({ 'GET /api/calculations': { status: 200, body: [] } });
    renderWithProviders(
      <AnalysisPanel
        designId={12}
        versionNumber={1}
        canSubmit
        pollMs={40}
        maskBands={[
          { from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, angles_deg: [0, 30] },
          { from_nm: 840, to_nm: 880, quantity: 'R', max_percent: 1 },
        ]}
      />,
    );
    // 420–880 nm with a 46 nm margin, rounded outward to 10 nm (plotRangeForMask); 1 nm steps.
    expect((screen.getByLabelText('From (nm)') as HTMLInputElement).value).toBe('370');
    expect((screen.getByLabelText('To (nm)') as HTMLInputElement).value).toBe('930');
    expect((screen.getByLabelText('Wavelengths') as HTMLInputElement).value).toBe('561');
  });

  it('queues the analysis, shows progress while it runs and the heat map once it completes', async () => {
    const poll = changing(calculation({ status: 'running', progress: 0.4 }));
    const api = mockApi({
      [SUBMIT]: { status: 201, body: { ...calculation({}), reused: false } },
      [POLL]: poll.handler,
      [RESULT]: { status: 200, body: RESULT_BODY },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel();

    await user.clear(screen.getByLabelText('Field profile at (nm)'));
    await user.type(screen.getByLabelText('Field profile at (nm)'), '550');
    await user.click(screen.getByRole('button', { name: 'Run analysis' }));

    const bar = await screen.findByRole('progressbar', { name: 'Analysis progress' });
    await waitFor(() => expect(bar.getAttribute('aria-valuenow')).toBe('40'));
    expect(screen.getByRole('status', { name: 'Analysis status' }).textContent).toBe(
      'Calculation 7 is running: 40 %',
    );
    expect(api.calls('POST', '/api/designs/12/versions/1/analysis').map((r) => r.body)).toEqual([
      { ...REQUEST, fieldWavelengthNm: 550, fieldAngleDeg: 0 },
    ]);

    poll.set(COMPLETED);
    const heat = await screen.findByRole('figure', { name: 'Heat map' });
    expect(screen.getByRole('status', { name: 'Analysis status' }).textContent).toBe(
      'Calculation 7 completed in 0.84 s',
    );
    expect(screen.queryByRole('progressbar', { name: 'Analysis progress' })).toBeNull();
    const trace = tracesOf(heat)[0]!;
    expect(trace.type).toBe('heatmap');
    expect(trace.x).toEqual([500, 550, 600]);
    expect(trace.y).toEqual([0, 30]);
    // Percent of the fractions the API sent.
    expect(trace.z).toEqual([
      [0.4, 0.2, 0.3],
      [0.5, 0.31, 0.42],
    ]);
    // Slices at the first and last analysed angles; colour and field profile from the summary.
    expect(tracesOf(screen.getByRole('figure', { name: 'Line slices' })).map((t) => t.name)).toEqual([
      '0°',
      '30°',
    ]);
    expect(tracesOf(screen.getByRole('figure', { name: 'Colour and Rv against angle' }))[0]!.y).toEqual([
      0.5, 0.62,
    ]);
    expect(tracesOf(screen.getByRole('figure', { name: 'Field profile' })).map((t) => t.name)).toEqual([
      '|E|² s',
      '|E|² p',
    ]);
    expect(screen.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(
      '/api/calculations/7/result.csv',
    );
  });

  it('shades the mask on the line slices and names the layers on the field profile', async () => {
    mockApi({ [RESULT]: { status: 200, body: RESULT_BODY } });
    const withLabels = calculation({
      status: 'completed',
      progress: 1,
      summary: {
        ...SUMMARY,
        field: { ...SUMMARY.field, interfacesNm: [0, 40, 100], layerLabels: ['1 SiO2', '2 TiO2'] },
      },
    });
    renderWithProviders(
      <AnalysisResults
        calculation={withLabels as AnalysisCalculationView}
        maskBands={[
          { from_nm: 520, to_nm: 580, quantity: 'R', max_percent: 0.25, angles_deg: [0] },
          { from_nm: 500, to_nm: 600, quantity: 'T', min_percent: 90 },
        ]}
      />,
    );
    const slices = await screen.findByRole('figure', { name: 'Line slices' });
    const layout = layoutOf(slices) as {
      yaxis: { range: number[]; dtick: number };
      shapes: { x0: number; x1: number; y0: number; y1: number }[];
    };
    // Slices 0.2–0.5 %: round ticks 0, 0.1, …, 0.5; only the R band is shaded, above its limit.
    expect(layout.yaxis).toMatchObject({ range: [0, 0.5], dtick: 0.1 });
    expect(layout.shapes).toEqual([expect.objectContaining({ x0: 520, x1: 580, y0: 0.25, y1: 0.5 })]);
    const field = layoutOf(screen.getByRole('figure', { name: 'Field profile' })) as {
      annotations: { text: string; x: number }[];
    };
    expect(field.annotations.map((a) => [a.text, a.x])).toEqual([
      ['1 SiO2', 20],
      ['2 TiO2', 70],
    ]);
  });

  it('cancels a running analysis', async () => {
    const poll = changing(calculation({ status: 'running', progress: 0.25 }));
    const api = mockApi({
      [SUBMIT]: {
        status: 201,
        body: { ...calculation({ status: 'running', progress: 0.25 }), reused: false },
      },
      [POLL]: poll.handler,
      'POST /api/calculations/7/cancel': () => {
        const cancelled = calculation({ status: 'cancelled', error: 'Cancelled by the user' });
        poll.set(cancelled);
        return { status: 201, body: cancelled };
      },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel();
    await user.click(screen.getByRole('button', { name: 'Run analysis' }));
    await screen.findByRole('progressbar', { name: 'Analysis progress' });

    await user.click(screen.getByRole('button', { name: 'Cancel' }));

    await waitFor(() =>
      expect(screen.getByRole('status', { name: 'Analysis status' }).textContent).toBe(
        'Calculation 7 was cancelled',
      ),
    );
    expect(screen.getByText('Cancelled by the user')).toBeTruthy();
    expect(screen.queryByRole('progressbar', { name: 'Analysis progress' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Cancel' })).toBeNull();
    expect(api.calls('POST', '/api/calculations/7/cancel')).toHaveLength(1);
  });

  it('shows a reused, completed analysis at once', async () => {
    mockApi({
      [SUBMIT]: { status: 200, body: { ...COMPLETED, reused: true } },
      [POLL]: { status: 200, body: COMPLETED },
      [RESULT]: { status: 200, body: RESULT_BODY },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel();
    await user.click(screen.getByRole('button', { name: 'Run analysis' }));

    expect(await screen.findByRole('figure', { name: 'Heat map' })).toBeTruthy();
    expect(screen.getByText(/An identical analysis was already on the queue/)).toBeTruthy();
    expect(screen.queryByRole('progressbar', { name: 'Analysis progress' })).toBeNull();
  });

  it('shows the version’s latest stored analysis on open, with who ran it and when', async () => {
    const api = mockApi({
      'GET /api/designs/12/versions/1/calculations/latest': {
        status: 200,
        body: { analysis: COMPLETED, fit: null, grow: null, yield: null },
      },
      [POLL]: { status: 200, body: COMPLETED },
      [RESULT]: { status: 200, body: RESULT_BODY },
    });
    renderPanel();
    expect(await screen.findByRole('figure', { name: 'Heat map' })).toBeTruthy();
    expect(screen.getByRole('status', { name: 'Analysis status' }).textContent).toBe(
      'Calculation 7 completed in 0.84 s',
    );
    expect(screen.getByLabelText('Analysis run by').textContent).toMatch(
      new RegExp(`^Run by ${COMPLETED.createdBy}, finished `),
    );
    expect(api.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });

  it('shows why a calculation failed', async () => {
    const failed = calculation({
      status: 'failed',
      error: 'TiO2 is valid over 400–1100 nm; the analysis asks for 300–700 nm',
    });
    mockApi({
      [SUBMIT]: { status: 201, body: { ...calculation({}), reused: false } },
      [POLL]: { status: 200, body: failed },
      'GET /api/calculations': { status: 200, body: [] },
    });
    const { user } = renderPanel();
    await user.click(screen.getByRole('button', { name: 'Run analysis' }));

    expect(
      await screen.findByText('TiO2 is valid over 400–1100 nm; the analysis asks for 300–700 nm'),
    ).toBeTruthy();
    expect(screen.getByRole('status', { name: 'Analysis status' }).textContent).toBe('Calculation 7 failed');
  });

  it('refuses a grid the engine would refuse, without queuing anything', async () => {
    const api = mockApi({});
    const { user } = renderPanel();
    const count = screen.getByLabelText('Wavelengths');
    await user.clear(count);
    await user.type(count, '5000');
    await user.clear(screen.getByLabelText('Angle to (°)'));
    await user.type(screen.getByLabelText('Angle to (°)'), '90');
    await user.click(screen.getByRole('button', { name: 'Run analysis' }));

    const section = within(screen.getByRole('region', { name: 'Full analysis' }));
    expect(section.getByText('A whole number from 1 to 4001')).toBeTruthy();
    expect(section.getByText('An angle from 0 to below 90°')).toBeTruthy();
    expect(api.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });
});
