import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf, isInvalid } from '../../../test/queries';
import { renderWithProviders } from '../../../test/render';
import type { MaterialView } from '../api/get-materials';
import { MaterialFormDialog } from '../components/material-form-dialog';

// Rules and answers: the Materials endpoints of the design-workspace API contract (the shared
// material schema; the engine's model validation: constant n > 0, k ≥ 0; Cauchy A > 0; range from < to; PUT with
// `version`, 409 "…changed by someone else (now version N); reload…").

const MGF2: MaterialView = {
  id: 4,
  name: 'MgF2',
  revision: 1,
  model: { model: 'cauchy', A: 1.37, B: 0.003, C: 0, k: 0 },
  rangeNm: { from: 200, to: 1100 },
  typical: true,
  provenance: { kind: 'typical', source: 'Typical value', date: null, run: '', notes: 'Evaporated film' },
  retiredAt: null,
  sourceFile: null,
  version: 2,
  updatedAt: '2026-12-01T08:00:00.000Z',
};

const STALE =
  'Material "MgF2" was changed by someone else (now version 3); reload it and apply your edit again';

type User = ReturnType<typeof renderWithProviders>['user'];

async function fill(user: User, dialog: ReturnType<typeof within>, label: string, text: string) {
  const field = dialog.getByLabelText(label);
  await user.clear(field);
  if (text) await user.type(field, text);
}

describe('MaterialFormDialog', () => {
  it('rejects n ≤ 0, negative k, a non-number and a reversed range without calling the API', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<MaterialFormDialog open material={null} onClose={() => {}} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New material' }));

    await fill(user, dialog, 'Name', 'Test oxide');
    await fill(user, dialog, 'n', '0');
    await fill(user, dialog, 'k', '-0.01');
    await fill(user, dialog, 'Valid from (nm)', '700');
    await fill(user, dialog, 'Valid to (nm)', '400');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));

    expect(isInvalid('n')).toBe(true);
    expect(descriptionOf('n')).toBe('n must be greater than 0 (got 0)');
    expect(descriptionOf('k')).toBe('k must be 0 or more (got -0.01)');
    expect(descriptionOf('Valid to (nm)')).toBe('To must be above From');
    expect(isInvalid('Valid from (nm)')).toBe(false);

    await user.selectOptions(dialog.getByLabelText('Dispersion model'), 'cauchy');
    await fill(user, dialog, 'A', 'abc');
    await fill(user, dialog, 'B (µm²)', '1e');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));
    expect(descriptionOf('A')).toBe('A must be a number');
    expect(descriptionOf('B (µm²)')).toBe('B must be a number');
    expect(api.requests).toHaveLength(0);
  });

  it('posts a valid Sellmeier model with its terms, range and provenance', async () => {
    const api = mockApi({
      'POST /api/materials': { status: 201, body: { ...MGF2, id: 20, name: 'Test glass' } },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<MaterialFormDialog open material={null} onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New material' }));

    await fill(user, dialog, 'Name', ' Test glass ');
    await user.selectOptions(dialog.getByLabelText('Dispersion model'), 'sellmeier');
    // N-BK7 coefficients, SCHOTT optical glass data sheet.
    await fill(user, dialog, 'B1', '1.03961212');
    await fill(user, dialog, 'C1 (µm²)', '0.00600069867');
    await fill(user, dialog, 'B2', '0.231792344');
    await fill(user, dialog, 'C2 (µm²)', '0.0200179144');
    await fill(user, dialog, 'B3', '1.01046945');
    await fill(user, dialog, 'C3 (µm²)', '103.560653');
    await fill(user, dialog, 'Valid from (nm)', '300');
    await fill(user, dialog, 'Valid to (nm)', '2500');
    await user.selectOptions(dialog.getByLabelText('Provenance'), 'published');
    await fill(user, dialog, 'Reference (authors, title, journal, DOI)', 'Glass data sheet');
    await fill(user, dialog, 'Date (YYYY-MM-DD)', '2026-11-30');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));

    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/materials').map((r) => r.body)).toEqual([
      {
        name: 'Test glass',
        model: {
          model: 'sellmeier',
          B: [1.03961212, 0.231792344, 1.01046945],
          C: [0.00600069867, 0.0200179144, 103.560653],
          k: 0,
          validNm: { from: 300, to: 2500 },
          clamp: false,
        },
        rangeNm: { from: 300, to: 2500 },
        typical: false,
        provenance: { kind: 'published', source: 'Glass data sheet', notes: '', date: '2026-11-30' },
      },
    ]);
  });

  it('takes resonance wavelengths λᵢ in µm and stores Cᵢ = λᵢ²; reads n live at the reference wavelength and 587.6 nm', async () => {
    const api = mockApi({
      'POST /api/materials': { status: 201, body: { ...MGF2, id: 21, name: 'Sapphire o' } },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(
      <MaterialFormDialog open material={null} onClose={onClose} referenceWavelengthNm={550} />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'New material' }));
    await fill(user, dialog, 'Name', 'Sapphire o');
    await user.selectOptions(dialog.getByLabelText('Dispersion model'), 'sellmeier');
    await user.selectOptions(dialog.getByLabelText('Enter the poles as'), 'lambda');
    // Sapphire, ordinary ray: I. H. Malitson and M. J. Dodge, J. Opt. Soc. Am. 62, 1405 (1972), as
    // B and resonance wavelengths in µm; n(589.3 nm) = 1.76808.
    await fill(user, dialog, 'B1', '1.4313493');
    await fill(user, dialog, 'λ1 (µm)', '0.0726631');
    await fill(user, dialog, 'B2', '0.65054713');
    await fill(user, dialog, 'λ2 (µm)', '0.1193242');
    await fill(user, dialog, 'B3', '5.3414021');
    await fill(user, dialog, 'λ3 (µm)', '18.028251');
    await fill(user, dialog, 'Valid from (nm)', '200');
    await fill(user, dialog, 'Valid to (nm)', '5000');
    await fill(user, dialog, 'Reference wavelength (nm)', '589.3');
    const readout = within(dialog.getByRole('region', { name: 'Index readout' }));
    expect(readout.getByLabelText('Index at 589.3 nm').textContent).toBe('589.3 nm: n = 1.76808, k = 0.00');
    expect(readout.getByLabelText('Index at 587.6 nm').textContent).toMatch(/^587\.6 nm: n = 1\.768\d\d/);

    // Outside the valid range the readout says the engine refuses it.
    await fill(user, dialog, 'Valid to (nm)', '500');
    expect(readout.getByLabelText('Index at 587.6 nm').textContent).toBe(
      '587.6 nm: outside the valid range (refused)',
    );
    await fill(user, dialog, 'Valid to (nm)', '5000');

    await user.selectOptions(dialog.getByLabelText('Provenance'), 'published');
    await fill(
      user,
      dialog,
      'Reference (authors, title, journal, DOI)',
      'Malitson and Dodge, JOSA 62, 1405 (1972)',
    );
    await user.click(dialog.getByRole('button', { name: 'Add material' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    const body = api.calls('POST', '/api/materials')[0]!.body as { model: { C: number[] } };
    expect(body.model.C).toEqual([0.0726631 ** 2, 0.1193242 ** 2, 18.028251 ** 2]);
  });

  it('requires provenance: a measured material needs its date and run', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<MaterialFormDialog open material={null} onClose={() => {}} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New material' }));
    await fill(user, dialog, 'Name', 'Shop SiO2');
    await fill(user, dialog, 'n', '1.46');
    await fill(user, dialog, 'Valid from (nm)', '400');
    await fill(user, dialog, 'Valid to (nm)', '900');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));
    expect(descriptionOf('Provenance')).toBe('Say where the data come from');

    await user.selectOptions(dialog.getByLabelText('Provenance'), 'measured');
    await user.click(dialog.getByRole('button', { name: 'Add material' }));
    expect(descriptionOf('Date (YYYY-MM-DD)')).toBe('A measurement needs its date');
    expect(descriptionOf('Run')).toBe('A measurement needs its run');
    expect(api.requests).toHaveLength(0);
  });

  it('sends the loaded version; on 409 shows the message and Reload loads the current material', async () => {
    const current: MaterialView = {
      ...MGF2,
      model: { model: 'cauchy', A: 1.372, B: 0.003, C: 0, k: 0 },
      version: 3,
    };
    const api = mockApi({
      'PUT /api/materials/4': [
        apiError(409, 'Conflict', STALE),
        { status: 200, body: { ...current, version: 4 } },
      ],
      'GET /api/materials/4': { status: 200, body: current },
      'GET /api/materials': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<MaterialFormDialog open material={MGF2} onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Edit MgF2' }));
    expect((dialog.getByLabelText('A') as HTMLInputElement).value).toBe('1.37');

    await fill(user, dialog, 'A', '1.375');
    await user.click(dialog.getByRole('button', { name: 'Save material' }));

    const alert = (await dialog.findByText(STALE)).closest('[role="alert"]') as HTMLElement;
    expect(api.calls('PUT', '/api/materials/4')[0]!.body).toMatchObject({ version: 2, model: { A: 1.375 } });
    expect(onClose).not.toHaveBeenCalled();

    await user.click(within(alert).getByRole('button', { name: 'Reload' }));
    await waitFor(() => expect((dialog.getByLabelText('A') as HTMLInputElement).value).toBe('1.372'));
    expect(dialog.queryByText(STALE)).toBeNull();

    await user.click(dialog.getByRole('button', { name: 'Save material' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('PUT', '/api/materials/4')[1]!.body).toMatchObject({ version: 3, model: { A: 1.372 } });
  });
});
