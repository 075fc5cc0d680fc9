import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';

// An invented chamber with two materials; MgF2 has a saved setting, SiO2 none.
const CHAMBER = {
  id: 7,
  name: 'Bell jar 1',
  monitorWavelengthsNm: [550],
  monitorChipMaterialId: 2,
  materials: [
    { materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 },
    { materialId: 5, toolingFactor: 1.02, rateNmPerS: 0.6 },
  ],
  notes: '',
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
};
const MATERIALS = [
  { id: 2, name: 'Fused silica' },
  { id: 4, name: 'MgF2' },
  { id: 5, name: 'SiO2' },
].map((m) => ({
  ...m,
  model: { model: 'constant', n: 1.4, k: 0 },
  rangeNm: { from: 200, to: 2000 },
  typical: true,
  provenance: { source: 'test', date: null, notes: '' },
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
}));
const MGF2 = {
  materialId: 4,
  substrateTemperatureC: 280,
  basePressureMbar: 2e-5,
  o2FlowSccm: null,
  o2PartialPressureMbar: null,
  arFlowSccm: null,
  ionVoltageV: null,
  ionCurrentA: null,
  ionGasFlowSccm: null,
  notes: '',
};
const SAVED = { chamberId: 7, settings: [MGF2], version: 3, updatedAt: '2026-12-02T08:00:00.000Z' };

describe('process settings on the Chambers page', () => {
  it('an engineer fills a material, is stopped by values out of range, and saves the whole set', async () => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.engineer } },
      'GET /api/chambers': { status: 200, body: [CHAMBER] },
      'GET /api/materials': { status: 200, body: MATERIALS },
      'GET /api/chambers/7/process-settings': { status: 200, body: SAVED },
      'PUT /api/chambers/7/process-settings': (req) => ({
        status: 200,
        body: { ...SAVED, version: 4, settings: (req.body as { settings: unknown[] }).settings },
      }),
    });
    const { user } = renderApp('/chambers');
    await user.click(
      await screen.findByRole('button', { name: 'Process settings of Bell jar 1' }, { timeout: 10_000 }),
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'Process settings: Bell jar 1' }));
    const mgf2 = within(await dialog.findByRole('group', { name: 'MgF2' }));
    expect((mgf2.getByLabelText('Substrate temperature (°C)') as HTMLInputElement).value).toBe('280');
    expect((mgf2.getByLabelText('Base pressure (mbar)') as HTMLInputElement).value).toBe('0.00002');
    const sio2 = within(dialog.getByRole('group', { name: 'SiO2' }));
    await user.type(sio2.getByLabelText('Substrate temperature (°C)'), '900');
    await user.type(sio2.getByLabelText('O₂ flow (sccm)'), '8');
    await user.type(sio2.getByLabelText('Ar flow (sccm)'), 'lots');
    await user.click(dialog.getByRole('button', { name: 'Save process settings' }));
    // The API's own schema (shared/src/schemas/process-settings.ts): at most 400 °C; base pressure
    // needed once a row is kept.
    expect(await sio2.findByText('At most 400 °C')).toBeTruthy();
    expect(sio2.getByText('Needed once the material has a setting')).toBeTruthy();
    expect(sio2.getByText('A number in sccm')).toBeTruthy();
    expect(api.calls('PUT', '/api/chambers/7/process-settings')).toHaveLength(0);

    await user.clear(sio2.getByLabelText('Substrate temperature (°C)'));
    await user.type(sio2.getByLabelText('Substrate temperature (°C)'), '200');
    await user.type(sio2.getByLabelText('Base pressure (mbar)'), '2e-5');
    await user.type(sio2.getByLabelText('Ion source voltage (V)'), '110');
    await user.clear(sio2.getByLabelText('Ar flow (sccm)'));
    await user.click(dialog.getByRole('button', { name: 'Save process settings' }));
    await screen.findByText('Process settings of Bell jar 1 saved.');
    const put = api.calls('PUT', '/api/chambers/7/process-settings')[0]!;
    expect(put.body).toEqual({
      version: 3,
      settings: [
        MGF2,
        {
          materialId: 5,
          substrateTemperatureC: 200,
          basePressureMbar: 2e-5,
          o2FlowSccm: 8,
          o2PartialPressureMbar: null,
          arFlowSccm: null,
          ionVoltageV: 110,
          ionCurrentA: null,
          ionGasFlowSccm: null,
          notes: '',
        },
      ],
    });
  });
});
