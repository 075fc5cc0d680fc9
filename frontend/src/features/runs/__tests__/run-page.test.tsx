import { screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { layoutOf, tracesOf } from '../../../test/plot-mock';
import { renderApp } from '../../../test/render';
import type { RunDetailView } from '../api/get-run';
import { CHAMBERS, COMPARISON, RECIPE, SPECTRUM, testRun } from './run-fixtures';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// API contract: GET/PUT /runs/:id (shared update-run schema: layerReadings {step, monitorThicknessNm?,
// rateNmPerS?, notes?}, durability {test, method, result, notes?}, notes), POST /runs/:id/spectra
// (400 with one `details` entry per bad row, nothing stored), GET …/comparison; Run diagnosis only
// for admins and engineers.

function api(role: Role, run: RunDetailView, extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/runs/40': { status: 200, body: run },
    'GET /api/recipes/12/1': { status: 200, body: RECIPE },
    'GET /api/chambers': { status: 200, body: CHAMBERS },
    'GET /api/runs': { status: 200, body: [run] },
    'GET /api/runs/40/spectra/31/comparison': { status: 200, body: COMPARISON },
    ...extra,
  });
}

async function section(name: string) {
  return within(await screen.findByRole('region', { name }, { timeout: 10_000 }));
}

/** A completed Run diagnosis of run 40 as the API sends it: design layer 2 (ZrO2) 8 % thin. */
function diagnosisCalculation() {
  return {
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
    summary: {
      residualRmsPercent: 0.0123,
      layers: [
        {
          layer: 2,
          materialId: 11,
          designNm: 127.6,
          fittedNm: 117.392,
          factor: 0.92,
          deviationPercent: -8,
        },
      ],
    },
  };
}

describe('Run page', () => {
  it('shows the run header and lists the layers in deposition order', async () => {
    api('operator', testRun());
    renderApp('/runs/40');

    expect(
      await screen.findByRole('heading', { level: 1, name: 'Run L-2026-118' }, { timeout: 10_000 }),
    ).toBeTruthy();
    expect((await screen.findByRole('link', { name: 'Lens AR trial v1' })).getAttribute('href')).toBe(
      '/recipes/12/1',
    );
    expect(screen.getByText(/Box coater B2 · 2026-12-01 · operator Jonah Pell/)).toBeTruthy();
    const readings = await section('Layer readings');
    const rows = readings.getAllByRole('row').slice(1);
    // Step 1 is deposited first, next to the substrate: the design's last (innermost) layer, SiO2.
    expect(
      rows.map((r) =>
        within(r)
          .getAllByRole('cell')
          .slice(0, 3)
          .map((c) => c.textContent),
      ),
    ).toEqual([
      ['1', 'SiO2', '76.2'],
      ['2', 'Al2O3', '84.2'],
      ['3', 'ZrO2', '127.6'],
      ['4', 'MgF2', '96.8'],
    ]);
  });

  it('saves the readings table with the right PUT body', async () => {
    const run = testRun({ layerReadings: [{ step: 2, monitorThicknessNm: 80, notes: 'old' }] });
    const calls = api('operator', run, {
      'PUT /api/runs/40': (req) => ({ status: 200, body: { ...run, ...(req.body as object) } }),
    });
    const { user } = renderApp('/runs/40');
    const readings = await section('Layer readings');

    expect((readings.getByLabelText('Monitor thickness of step 2') as HTMLInputElement).value).toBe('80');
    await user.type(readings.getByLabelText('Monitor thickness of step 1'), '70.4');
    await user.type(readings.getByLabelText('Rate of step 1'), '0.5');
    await user.clear(readings.getByLabelText('Remarks on step 2'));
    await user.type(readings.getByLabelText('Rate of step 4'), '1.2');
    await user.type(readings.getByLabelText('Remarks on step 4'), ' rate dipped at 60 nm ');
    await user.type(readings.getByLabelText('Run notes'), 'Pump-down 42 min');
    await user.click(readings.getByRole('button', { name: 'Save readings' }));

    await waitFor(() => expect(calls.calls('PUT', '/api/runs/40')).toHaveLength(1));
    expect(calls.calls('PUT', '/api/runs/40')[0]!.body).toEqual({
      version: 3,
      layerReadings: [
        { step: 1, monitorThicknessNm: 70.4, rateNmPerS: 0.5 },
        { step: 2, monitorThicknessNm: 80 },
        { step: 4, rateNmPerS: 1.2, notes: 'rate dipped at 60 nm' },
      ],
      notes: 'Pump-down 42 min',
    });
  });

  it('after saving readings and then durability, shows each section exactly once with the saved values', async () => {
    let current = testRun();
    const calls = api('operator', current, {
      'GET /api/runs/40': () => ({ status: 200, body: current }),
      'PUT /api/runs/40': (req) => {
        // As the API does: the change applies only at the run's version, which then moves on.
        const { version, ...changes } = req.body as { version: number };
        if (version !== current.version)
          return apiError(409, 'Conflict', 'Run L-2026-118 was changed meanwhile');
        current = { ...current, ...changes, version: current.version + 1 };
        return { status: 200, body: current };
      },
    });
    const { user } = renderApp('/runs/40');
    const readings = await section('Layer readings');
    await user.type(readings.getByLabelText('Monitor thickness of step 1'), '70.4');
    await user.click(readings.getByRole('button', { name: 'Save readings' }));
    await waitFor(() => expect(current.layerReadings).toEqual([{ step: 1, monitorThicknessNm: 70.4 }]));

    const durability = await section('Durability results');
    await user.selectOptions(durability.getByLabelText('Adhesion'), 'pass');
    await user.type(durability.getByLabelText('Adhesion method'), 'ISO 9211-4, tape adhesion');
    await user.click(durability.getByRole('button', { name: 'Save durability results' }));
    await waitFor(() => expect(current.durability).toHaveLength(1));
    // The second save is based on the version the first one returned.
    expect(calls.calls('PUT', '/api/runs/40').map((c) => (c.body as { version: number }).version)).toEqual([
      3, 4,
    ]);

    await waitFor(() => expect(screen.getAllByRole('region', { name: 'Layer readings' })).toHaveLength(1));
    expect(screen.getAllByRole('region', { name: 'Durability results' })).toHaveLength(1);
    const after = await section('Layer readings');
    expect((after.getByLabelText('Monitor thickness of step 1') as HTMLInputElement).value).toBe('70.4');
    expect(
      ((await section('Durability results')).getByLabelText('Adhesion method') as HTMLInputElement).value,
    ).toBe('ISO 9211-4, tape adhesion');
  });

  it('someone other than the run’s operator reads the record, cannot change it, and adds a remark', async () => {
    let current = testRun({
      layerReadings: [{ step: 1, monitorThicknessNm: 70.4 }],
      remarks: [
        {
          at: '2026-12-01T14:00:00.000Z',
          by: { id: 4, displayName: 'Jonah Pell' },
          text: 'Door seal replaced',
        },
      ],
    });
    const calls = api('engineer', current, {
      'GET /api/runs/40': () => ({ status: 200, body: current }),
      'POST /api/runs/40/remarks': (req) => {
        const { text } = req.body as { text: string };
        current = {
          ...current,
          remarks: [
            ...current.remarks,
            { at: '2026-12-01T15:00:00.000Z', by: { id: 2, displayName: 'Tomas Reyne' }, text },
          ],
        };
        return { status: 201, body: current };
      },
    });
    const { user } = renderApp('/runs/40');
    const readings = await section('Layer readings');
    expect(
      await screen.findByText(
        /This run was logged by Jonah Pell; only they can change its readings, durability results and notes/,
      ),
    ).toBeTruthy();
    expect((readings.getByLabelText('Monitor thickness of step 1') as HTMLInputElement).disabled).toBe(true);
    expect(readings.queryByRole('button', { name: 'Save readings' })).toBeNull();

    const remarks = await section('Remarks');
    expect(remarks.getByText('Door seal replaced')).toBeTruthy();
    expect(remarks.getByText(/^Jonah Pell · /)).toBeTruthy();
    const add = remarks.getByRole('button', { name: 'Add remark' });
    expect((add as HTMLButtonElement).disabled).toBe(true);
    await user.type(remarks.getByLabelText('New remark'), '  Witness 2 hazy at the rim ');
    await user.click(add);
    await waitFor(() => expect(calls.calls('POST', '/api/runs/40/remarks')).toHaveLength(1));
    expect(calls.calls('POST', '/api/runs/40/remarks')[0]!.body).toEqual({
      text: 'Witness 2 hazy at the rim',
    });
    expect(await remarks.findByText('Witness 2 hazy at the rim')).toBeTruthy();
    expect(remarks.getByText(/^Tomas Reyne · /)).toBeTruthy();
    expect((remarks.getByLabelText('New remark') as HTMLTextAreaElement).value).toBe('');
    expect(calls.calls('PUT', '/api/runs/40')).toHaveLength(0);
  });

  it('refuses a negative monitor thickness before sending', async () => {
    const calls = api('operator', testRun());
    const { user } = renderApp('/runs/40');
    const readings = await section('Layer readings');

    await user.type(readings.getByLabelText('Monitor thickness of step 3'), '-5');
    await user.click(readings.getByRole('button', { name: 'Save readings' }));

    expect(await readings.findByText('Monitor thickness must be a number > 0')).toBeTruthy();
    expect(calls.calls('PUT', '/api/runs/40')).toHaveLength(0);
  });

  it("refuses an angle of 90° and a remark over 2000 characters with the API's messages, sending nothing", async () => {
    const calls = api('operator', testRun());
    const { user } = renderApp('/runs/40');
    const upload = await section('Spectrum upload');
    await user.upload(
      upload.getByLabelText('Spectrum file'),
      new File(['wavelength_nm,R_percent\n'], 'w.csv'),
    );
    await user.clear(upload.getByLabelText('Angle of incidence (°)'));
    await user.type(upload.getByLabelText('Angle of incidence (°)'), '90');
    await user.click(upload.getByRole('button', { name: 'Upload spectrum' }));
    expect(await upload.findByText('Enter an angle from 0 to 89°')).toBeTruthy();

    const remarks = await section('Remarks');
    await user.click(remarks.getByLabelText('New remark'));
    await user.paste('x'.repeat(2001));
    expect(await remarks.findByText('At most 2000 characters')).toBeTruthy();
    await user.click(remarks.getByRole('button', { name: 'Add remark' }));
    expect(calls.calls('POST', '/api/runs/40/spectra')).toHaveLength(0);
    expect(calls.calls('POST', '/api/runs/40/remarks')).toHaveLength(0);
  });

  it('saves durability results with the method named, and asks for a method', async () => {
    const run = testRun({ durability: [{ test: 'other', method: 'Salt spray, 24 h', result: 'pass' }] });
    const calls = api('operator', run, {
      'PUT /api/runs/40': (req) => ({ status: 200, body: { ...run, ...(req.body as object) } }),
    });
    const { user } = renderApp('/runs/40');
    const durability = await section('Durability results');

    await user.selectOptions(durability.getByLabelText('Adhesion'), 'pass');
    await user.selectOptions(durability.getByLabelText('Humidity'), 'fail');
    await user.type(durability.getByLabelText('Humidity method'), 'ISO 9022-2, damp heat');
    await user.click(durability.getByRole('button', { name: 'Save durability results' }));
    expect(
      await durability.findByText('Name the test procedure followed (e.g. ISO 9211-4, tape adhesion)'),
    ).toBeTruthy();
    expect(calls.calls('PUT', '/api/runs/40')).toHaveLength(0);

    await user.type(durability.getByLabelText('Adhesion method'), 'ISO 9211-4, tape adhesion');
    await user.type(durability.getByLabelText('Humidity notes'), 'haze at the edge');
    await user.click(durability.getByRole('button', { name: 'Save durability results' }));
    await waitFor(() => expect(calls.calls('PUT', '/api/runs/40')).toHaveLength(1));
    expect(calls.calls('PUT', '/api/runs/40')[0]!.body).toEqual({
      version: 3,
      durability: [
        { test: 'adhesion', method: 'ISO 9211-4, tape adhesion', result: 'pass' },
        { test: 'humidity', method: 'ISO 9022-2, damp heat', result: 'fail', notes: 'haze at the edge' },
        { test: 'other', method: 'Salt spray, 24 h', result: 'pass' },
      ],
    });
  });

  it('shows every row problem of a refused spectrum file and no comparison', async () => {
    const problems = ['row 3: not a number: R "x"', 'row 4: R must lie between 0 and 100 percent (got -2)'];
    const calls = api('operator', testRun(), {
      'POST /api/runs/40/spectra': apiError(400, 'Bad Request', problems.join('; '), problems),
    });
    const { user } = renderApp('/runs/40');
    const upload = await section('Spectrum upload');

    const text = 'wavelength_nm,R_percent\n400,0.3\n405,x\n410,-2\n';
    await user.upload(
      upload.getByLabelText('Spectrum file'),
      new File([text], 'bad.csv', { type: 'text/csv' }),
    );
    await user.clear(upload.getByLabelText('Angle of incidence (°)'));
    await user.type(upload.getByLabelText('Angle of incidence (°)'), '6');
    await user.selectOptions(upload.getByLabelText('Sample'), 'part');
    await user.click(upload.getByRole('button', { name: 'Upload spectrum' }));

    const list = within(await upload.findByRole('list', { name: 'Problems in the file' }));
    expect(list.getAllByRole('listitem').map((li) => li.textContent)).toEqual(problems);
    expect(upload.getByRole('alert').textContent).toContain('Nothing was saved');
    expect(calls.calls('POST', '/api/runs/40/spectra').map((r) => r.body)).toEqual([
      { filename: 'bad.csv', csv: text, angleDeg: 6, sample: 'part' },
    ]);
    expect(screen.queryByRole('region', { name: 'Comparison with design and mask' })).toBeNull();
    expect(screen.getByText('No spectrum has been uploaded for this run yet.')).toBeTruthy();
  });

  it('sends the chosen quantity for a file with both R and T, and no quantity by default', async () => {
    const calls = api('operator', testRun(), {
      'POST /api/runs/40/spectra': apiError(400, 'Bad Request', 'no rows at 8°', ['no rows at 8°']),
    });
    const { user } = renderApp('/runs/40');
    const upload = await section('Spectrum upload');
    const text = 'wavelength_nm,angle_deg,pol,R,T,A\n500,0,avg,0.01,0.99,0\n600,0,avg,0.02,0.98,0\n';
    await user.upload(upload.getByLabelText('Spectrum file'), new File([text], 'calc.csv'));
    await user.click(upload.getByRole('button', { name: 'Upload spectrum' }));
    await upload.findByRole('list', { name: 'Problems in the file' });
    await user.selectOptions(upload.getByLabelText('Quantity'), 'T');
    await user.clear(upload.getByLabelText('Angle of incidence (°)'));
    await user.type(upload.getByLabelText('Angle of incidence (°)'), '0');
    await user.click(upload.getByRole('button', { name: 'Upload spectrum' }));
    await waitFor(() => expect(calls.calls('POST', '/api/runs/40/spectra')).toHaveLength(2));
    expect(calls.calls('POST', '/api/runs/40/spectra').map((r) => r.body)).toEqual([
      { filename: 'calc.csv', csv: text, angleDeg: 8, sample: 'witness' },
      { filename: 'calc.csv', csv: text, angleDeg: 0, sample: 'witness', quantity: 'T' },
    ]);
  });

  it('after an upload shows Fail, the worst margin and where, the plot and the original file link', async () => {
    let uploaded = false;
    api('operator', testRun(), {
      'GET /api/runs/40': () => ({
        status: 200,
        body: testRun({ spectra: uploaded ? [SPECTRUM] : [] }),
      }),
      'POST /api/runs/40/spectra': () => {
        uploaded = true;
        return { status: 201, body: SPECTRUM };
      },
    });
    const { user } = renderApp('/runs/40');
    const upload = await section('Spectrum upload');
    const csv = 'wavelength_nm,R_percent\n400,0.4\n500,0.3\n610,0.7\n700,0.4\n';
    await user.upload(upload.getByLabelText('Spectrum file'), new File([csv], 'witness-118.csv'));
    await user.click(upload.getByRole('button', { name: 'Upload spectrum' }));

    const comparison = await section('Comparison with design and mask');
    const verdict = await comparison.findByRole('status', { name: 'Measured against the mask' });
    expect(verdict.textContent).toBe(
      'HVS-2210 lens AR rev A:FailWorst margin −0.200 percentage points at 610 nm: R 0.700 %',
    );
    const figure = comparison.getByRole('figure', { name: 'Measured against design' });
    const traces = tracesOf(figure);
    expect(traces.map((t) => t.name)).toEqual(['Measured R 8°', 'Design R 8° avg']);
    expect(traces[0]!.y).toEqual([0.4, 0.3, 0.7, 0.4]);
    expect(traces[1]!.y).toEqual([0.35, 0.2, 0.3, 0.45]);
    // The forbidden region of "R ≤ 0.5 %" over 420–680 nm, from the limit up to the top of the plot.
    const shapes = layoutOf(figure).shapes as { x0: number; x1: number; y0: number; y1: number }[];
    expect(shapes).toHaveLength(1);
    expect(shapes[0]).toMatchObject({ x0: 420, x1: 680, y0: 0.5, y1: 1 });
    const link = comparison.getByRole('link', { name: 'Download the original file (witness-118.csv)' });
    expect(link.getAttribute('href')).toBe('/api/runs/40/spectra/31/original');
  });

  it('shows Pass with a positive worst margin', async () => {
    const passing = {
      ...COMPARISON,
      mask: {
        ...COMPARISON.mask!,
        pass: true,
        worstMargin: 0.1234,
        worstBand: 0,
        bands: [
          {
            band: 0,
            evaluated: true,
            pass: true,
            worstMargin: 0.1234,
            worstAt: { wavelengthNm: 588, valuePercent: 0.3766 },
          },
        ],
      },
    };
    api('operator', testRun({ spectra: [SPECTRUM] }), {
      'GET /api/runs/40/spectra/31/comparison': { status: 200, body: passing },
    });
    renderApp('/runs/40');
    const comparison = await section('Comparison with design and mask');
    const verdict = await comparison.findByRole('status', { name: 'Measured against the mask' });
    expect(verdict.textContent).toBe(
      'HVS-2210 lens AR rev A:PassWorst margin +0.123 percentage points at 588 nm: R 0.377 %',
    );
  });

  it('operators see the run’s stored diagnosis with who ran it, and cannot run one', async () => {
    const stored = { ...diagnosisCalculation(), id: 78 };
    const calls = api('operator', testRun({ spectra: [SPECTRUM] }), {
      'GET /api/runs/40/diagnosis/latest': { status: 200, body: { calculation: stored } },
    });
    renderApp('/runs/40');
    const panel = await section('Run diagnosis');
    expect(panel.queryByRole('button', { name: 'Run diagnosis' })).toBeNull();
    const table = within(await panel.findByRole('table', { name: 'Fitted thickness factors' }));
    expect(within(table.getAllByRole('row')[1]!).getAllByRole('cell')[6]!.textContent).toBe('0.920');
    expect(panel.getByLabelText('Diagnosis run by').textContent).toMatch(/^Run by Tomas Reyne, finished /);
    expect(calls.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });

  it('engineers get Run diagnosis of the shown spectrum, with the layers and materials of its recipe', async () => {
    // One finding in the shape the worker sends: design layer 2 (ZrO2 in the recipe) 8 % thin.
    const completed = diagnosisCalculation();
    api('engineer', testRun({ spectra: [SPECTRUM] }), {
      'POST /api/runs/40/spectra/31/diagnosis': { status: 201, body: { ...completed, reused: false } },
      'GET /api/calculations/77': { status: 200, body: completed },
    });
    const { user } = renderApp('/runs/40');
    const panel = await section('Run diagnosis');
    expect(panel.getByText(/witness-118\.csv/)).toBeTruthy();

    await user.click(panel.getByRole('button', { name: 'Run diagnosis' }));
    const table = within(await panel.findByRole('table', { name: 'Fitted thickness factors' }));
    // Four layers: design layer 2 is deposited in step 3.
    expect(
      within(table.getAllByRole('row')[1]!)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['1', '2', '3', 'ZrO2', '127.6', '117.4', '0.920', '−8.00 %', 'Likely deviated']);
  });
});
