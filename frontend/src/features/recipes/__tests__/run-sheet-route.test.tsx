import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { buildRunSheet, SAFETY_CAUTIONS } from '@quietglass/shared';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { AppProviders } from '../../../app/providers';
import { RunSheetRoute } from '../../../app/routes/run-sheet-route';
import { createQueryClient } from '../../../lib/query-client';
import { mockApi } from '../../../test/mock-api';
import { tracesOf } from '../../../test/plot-mock';
import type { RunSheetView } from '../api/get-run-sheet';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

/*
 * The 4-layer recipe of the hand calculation (also in shared/src/runsheet.test.ts and
 * backend/test/chambers.e2e-spec.ts), with constant indices L 1.5 and H 2.0 on a 1.52 chip, chamber
 * TF L 1.2 / H 0.75, rates L 0.5 / H 0.25 nm/s, monitor at 600 nm. By hand: monitor = part ÷ TF,
 * QWOT = 4·n·d_monitor/λ, time = d_monitor ÷ rate. Invented chamber and customer.
 */
const constant = (n: number) => ({ model: 'constant' as const, n, k: 0 });
const BUILT = buildRunSheet({
  layers: [
    { material: 'L', model: constant(1.5), thicknessNm: 120 },
    { material: 'H', model: constant(2.0), thicknessNm: 60 },
    { material: 'L', model: constant(1.5), thicknessNm: 30 },
    { material: 'H', model: constant(2.0), thicknessNm: 15 },
  ],
  monitorChip: constant(1.52),
  chamber: {
    monitorWavelengthNm: 600,
    materials: { L: { toolingFactor: 1.2, rateNmPerS: 0.5 }, H: { toolingFactor: 0.75, rateNmPerS: 0.25 } },
  },
});
/** Process settings kept for H only (invented test values). */
const H_PROCESS = {
  materialId: 12,
  substrateTemperatureC: 250,
  basePressureMbar: 2e-5,
  o2FlowSccm: 12,
  o2PartialPressureMbar: null,
  arFlowSccm: null,
  ionVoltageV: 120,
  ionCurrentA: 2.5,
  ionGasFlowSccm: 8,
  notes: '',
};
const SHEET: RunSheetView = {
  ...BUILT,
  layers: BUILT.layers.map((l) => ({ ...l, process: l.material === 'H' ? H_PROCESS : null })),
  recipe: { designId: 30, number: 1, name: 'Sheet check', customer: 'Fenwick Optics Lab' },
  chamber: { id: 4, name: 'Test bell jar' },
  calibration: {
    chamberVersion: 3,
    materials: [
      { material: 'L', toolingFactor: 1.2, decision: null },
      {
        material: 'H',
        toolingFactor: 0.75,
        decision: { id: 7, decidedAt: '2026-12-02T09:00:00.000Z', decidedBy: 'Test Engineer' },
      },
    ],
  },
  shop: { name: 'Fenwick Coating Shop', hasLogo: false },
  substrate: { material: 'N-BK7', thicknessMm: 2, designThicknessMm: 2 },
  job: { part: '', quantity: null, sides: 'front' },
};

const CHAMBERS = [
  {
    id: 4,
    name: 'Test bell jar',
    monitorWavelengthsNm: [600, 632.8],
    monitorChipMaterialId: 2,
    materials: [],
    notes: '',
    version: 1,
    updatedAt: '2026-12-01T08:00:00.000Z',
  },
];

const RECIPE = {
  designId: 30,
  number: 1,
  name: 'Sheet check',
  status: 'released',
  rowVersion: 4,
  layers: [],
  createdBy: { id: 2, displayName: 'Mira Castell' },
};

function renderRoute(path: string) {
  const router = createMemoryRouter([{ path: '/recipes/:designId/:number', element: <RunSheetRoute /> }], {
    initialEntries: [path],
  });
  const user = userEvent.setup();
  render(
    <AppProviders queryClient={createQueryClient()}>
      <RouterProvider router={router} />
    </AppProviders>,
  );
  return { user, router };
}

describe('RunSheetRoute', () => {
  it("shows the API's numbers per layer in deposition order, the totals and the cautions", async () => {
    const api = mockApi({
      'GET /api/recipes/30/1': { status: 200, body: RECIPE },
      'GET /api/chambers': { status: 200, body: CHAMBERS },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600': { status: 200, body: SHEET },
    });
    renderRoute('/recipes/30/1?chamberId=4');

    const table = await screen.findByRole('table', { name: 'Run sheet layers' });
    const rows = within(table)
      .getAllByRole('row')
      .map((r) =>
        within(r)
          .queryAllByRole('cell')
          .map((c) => c.textContent),
      );
    // Body rows: step, design layer, material, part, TF, monitor, QWOT, rate, time (turning points last).
    expect(rows.slice(1, 5).map((r) => r.slice(0, 9))).toEqual([
      ['1', '4', 'H', '15.00', '0.750', '20.00', '0.267', '0.25', '80.0'],
      ['2', '3', 'L', '30.00', '1.200', '25.00', '0.250', '0.50', '50.0'],
      ['3', '2', 'H', '60.00', '0.750', '80.00', '1.067', '0.25', '320.0'],
      ['4', '1', 'L', '120.00', '1.200', '100.00', '1.000', '0.50', '200.0'],
    ]);
    // Totals by hand: part 225 nm, monitor 20 + 25 + 80 + 100 = 225 nm, time 650 s = 10 min 50 s.
    expect(rows[5]).toEqual(['Totals', '225.00', '', '225.00', '', '', '650.0', '']);
    expect(screen.getByLabelText('Run time').textContent).toMatch(/^Deposition time 10 min 50 s/);
    expect(screen.getByLabelText('Calibration used').textContent).toBe(
      'Tooling factors from chamber version 3: L 1.2 (chamber setting); H 0.75 (calibration #7, accepted 2026-12-02 by Test Engineer).',
    );
    expect(
      screen.getByText(/Tooling factor = thickness on the part ÷ thickness on the monitor/),
    ).toBeTruthy();

    const cautions = screen.getByRole('region', { name: 'Safety cautions' });
    expect([...cautions.querySelectorAll('li')].map((li) => li.textContent)).toEqual([...SAFETY_CAUTIONS]);
    expect(cautions.textContent).toMatch(/do not replace the shop’s own safety procedures/);
    expect(cautions.textContent).toMatch(/local regulations/);

    const pdf = screen.getByRole('link', { name: 'Download PDF' });
    expect(pdf.getAttribute('href')).toBe(
      '/api/recipes/30/1/run-sheet.pdf?chamberId=4&monitorWavelengthNm=600',
    );
    expect(screen.getByRole('link', { name: 'Start a run' }).getAttribute('href')).toBe('/runs?recipe=30:1');
    expect((screen.getByRole('button', { name: 'Print' }) as HTMLButtonElement).disabled).toBe(false);
    // Printing hides the app's top bar and navigation (a print rule of this page only).
    const printRules = [...document.querySelectorAll('style')]
      .map((style) => style.textContent ?? '')
      .filter((css) => css.includes('@media print'));
    expect(printRules.join('\n')).toMatch(
      /\.MuiAppBar-root,\s*\.MuiDrawer-root[^{]*\{\s*display:\s*none\s*!important/,
    );
    expect(api.unexpected).toEqual([]);
  });

  it('plots the monitor signal on one thickness axis with the turning points marked', async () => {
    mockApi({
      'GET /api/recipes/30/1': { status: 200, body: RECIPE },
      'GET /api/chambers': { status: 200, body: CHAMBERS },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600': { status: 200, body: SHEET },
    });
    renderRoute('/recipes/30/1?chamberId=4');
    const figure = await screen.findByRole('figure', { name: 'Expected monitor signal' });
    const traces = tracesOf(figure) as { name: string; x: number[]; y: number[] }[];
    expect(traces.map((t) => t.name)).toEqual(['1 H', '2 L', '3 H', '4 L', 'Turning points', 'Layer ends']);
    // Layer 2 starts where layer 1 stopped on the monitor (20 nm) and ends at 20 + 25 = 45 nm.
    expect(traces[1]!.x[0]).toBeCloseTo(20, 9);
    expect(traces[1]!.x[traces[1]!.x.length - 1]).toBeCloseTo(45, 9);
    // The bare chip transmits (1 − R)/(1 + R) = 91.8318 % for n 1.52 (Macleod, Thin-Film Optical Filters, ch. 2).
    expect(traces[0]!.y[0]).toBeCloseTo(91.8318, 3);
    // Turning points are the API's, shifted by the monitor thickness deposited before their layer.
    const offsets = [0, 20, 45, 125];
    const expected = SHEET.layers.flatMap((l, i) => l.turningPointsNm.map((t) => offsets[i]! + t));
    expect(expected.length).toBeGreaterThan(0);
    expect(traces[4]!.x).toEqual(expected.map((x) => expect.closeTo(x, 9) as unknown as number));
    expect(traces[5]!.x.map((x) => Number(x.toFixed(9)))).toEqual([20, 45, 125, 225]);
  });

  it('asks for a chamber first and offers no PDF until there is a sheet', async () => {
    const api = mockApi({
      'GET /api/recipes/30/1': { status: 200, body: RECIPE },
      'GET /api/chambers': { status: 200, body: CHAMBERS },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=632.8': { status: 200, body: SHEET },
    });
    const { user } = renderRoute('/recipes/30/1');
    expect(await screen.findByText(/Choose a chamber: the monitor thicknesses/)).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Download PDF' }) as HTMLButtonElement).disabled).toBe(true);
    await user.selectOptions(screen.getByLabelText('Chamber'), 'Test bell jar');
    await user.selectOptions(screen.getByLabelText('Monitor wavelength (nm)'), '632.8');
    await screen.findByRole('table', { name: 'Run sheet layers' });
    expect(
      api.calls('GET', '/api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=632.8'),
    ).toHaveLength(1);
  });

  it('names the job, labels the monitor QWOT, prints process settings and has room to write and sign', async () => {
    const withJob: RunSheetView = {
      ...SHEET,
      substrate: { material: 'N-BK7', thicknessMm: 2.2, designThicknessMm: 2 },
      job: { part: 'FW-7 window', quantity: 24, sides: 'front' },
    };
    const api = mockApi({
      'GET /api/recipes/30/1': { status: 200, body: RECIPE },
      'GET /api/chambers': { status: 200, body: CHAMBERS },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600': { status: 200, body: SHEET },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600&part=FW-7+window': {
        status: 200,
        body: { ...withJob, job: { ...withJob.job, quantity: null }, substrate: SHEET.substrate },
      },
      // Leaving the quantity field applies it before the thickness is typed.
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600&part=FW-7+window&quantity=24': {
        status: 200,
        body: { ...withJob, substrate: SHEET.substrate },
      },
      'GET /api/recipes/30/1/run-sheet?chamberId=4&monitorWavelengthNm=600&part=FW-7+window&quantity=24&substrateThicknessMm=2.2':
        { status: 200, body: withJob },
    });
    const { user, router } = renderRoute('/recipes/30/1?chamberId=4');
    const table = await screen.findByRole('table', { name: 'Run sheet layers' });
    const headers = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toContain('Monitor QWOT at 600 nm');
    expect(headers.slice(-4)).toEqual([
      'Process settings',
      'Actual end thickness (nm)',
      'Actual rate (nm/s)',
      'Remarks',
    ]);
    // Step 1 is H (process kept), step 2 is L (none kept).
    const step1 = within(table).getAllByRole('row')[1]!;
    expect(step1.textContent).toContain('Base pressure ≤ 2.0 × 10⁻⁵ mbar');
    expect(step1.textContent).toContain('Ion assist 120 V, 2.5 A, gas 8 sccm');
    expect(within(table).getAllByRole('row')[2]!.textContent).toContain('None kept for this material');
    expect(within(table).getByLabelText('Actual end thickness, step 1').textContent).toBe('');
    const signOff = screen.getByRole('region', { name: 'Sign-off' });
    expect(within(signOff).getByRole('group', { name: 'Run by (operator)' })).toBeTruthy();
    expect(within(signOff).getByRole('group', { name: 'Checked by' })).toBeTruthy();
    expect(screen.getByRole('banner', { name: 'Run sheet header' }).textContent).toContain(
      'Fenwick Coating Shop',
    );

    // A quantity that is not a whole number is refused before anything is asked of the API.
    await user.type(screen.getByLabelText('Part'), 'FW-7 window');
    await user.tab();
    await screen.findByText('FW-7 window');
    await user.type(screen.getByLabelText('Quantity'), '2.5');
    await user.tab();
    expect(screen.getByText('A whole number of parts')).toBeTruthy();
    await user.clear(screen.getByLabelText('Quantity'));
    await user.type(screen.getByLabelText('Quantity'), '24');
    await user.type(screen.getByLabelText('Substrate thickness (mm)'), '0');
    await user.tab();
    expect(screen.getByText('Must be more than 0 mm')).toBeTruthy();
    // The API's own query schema checks the typed thickness.
    await user.clear(screen.getByLabelText('Substrate thickness (mm)'));
    await user.type(screen.getByLabelText('Substrate thickness (mm)'), '2.2{Enter}');
    await screen.findByText('24 pcs');
    expect(screen.getByText('N-BK7, 2.2 mm (design: 2 mm) thick')).toBeTruthy();
    expect(router.state.location.search).toBe(
      '?chamberId=4&part=FW-7+window&quantity=24&substrateThicknessMm=2.2',
    );
    expect(screen.getByRole('link', { name: 'Download PDF' }).getAttribute('href')).toBe(
      '/api/recipes/30/1/run-sheet.pdf?chamberId=4&monitorWavelengthNm=600&part=FW-7+window&quantity=24&substrateThicknessMm=2.2',
    );
    // "Both surfaces" is not this design's choice.
    const both = within(screen.getByLabelText('Sides to coat')).getByRole('option', {
      name: /Both surfaces/,
    }) as HTMLOptionElement;
    expect(both.disabled).toBe(true);
    expect(api.unexpected, api.unexpected.join()).toEqual([]);
  });
});
