import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { ConstantsFileDialog } from '../components/constants-file-dialog';

// A published optical-constants file (public domain): CaF2, I. H. Malitson, Appl. Opt. 2, 1103
// (1963), Sellmeier formula stated for 0.23–9.7 µm.
const CAF2 = `REFERENCES: |
    I. H. Malitson.
    A redetermination of some optical properties of calcium fluoride.
    <a href="https://doi.org/10.1364/AO.2.001103"><i>Appl. Opt.</i> <b>2</b>, 1103-1107 (1963)</a>
COMMENTS: |
    24 °C
DATA:
  - type: formula 1
    wavelength_range: 0.23 9.7
    coefficients: 0 0.5675888 0.050263605 0.4710914 0.1003909 3.8484723 34.649040
`;

const yml = (text: string, name = 'caf2--malitson.yml') =>
  new File([text], name, { type: 'application/yaml' });

describe('ConstantsFileDialog', () => {
  it('previews the reference, data form and range, then imports the file', async () => {
    const api = mockApi({
      'POST /api/materials/import-constants': { status: 201, body: { id: 40, name: 'CaF2 windows' } },
      'GET /api/materials': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<ConstantsFileDialog open onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Import published constants' }));
    await user.upload(dialog.getByLabelText('Constants file'), yml(CAF2));

    const preview = within(await dialog.findByRole('region', { name: 'Preview of the constants file' }));
    expect(
      preview.getByText(
        /A redetermination of some optical properties of calcium fluoride\. Appl\. Opt\. 2, 1103-1107 \(1963\)/,
      ),
    ).toBeTruthy();
    expect(preview.getByText(/DOI: 10\.1364\/AO\.2\.001103/)).toBeTruthy();
    expect(
      preview.getByText(
        'Data: Sellmeier formula (formula 1, resonance wavelengths in µm), 0.23–9.7 µm; valid 230–9700 nm.',
      ),
    ).toBeTruthy();

    await user.type(dialog.getByLabelText('Material name'), 'CaF2 windows');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/materials/import-constants')[0]!.body).toEqual({
      name: 'CaF2 windows',
      text: CAF2,
      fileName: 'caf2--malitson.yml',
      clamp: false,
    });
  });

  it('says why a file cannot be read and sends nothing', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<ConstantsFileDialog open onClose={() => {}} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Import published constants' }));
    await user.upload(dialog.getByLabelText('Constants file'), yml(CAF2.replace('formula 1', 'formula 9')));
    expect(await dialog.findByText(/The file cannot be read: .*"formula 9" is not read/)).toBeTruthy();
    await user.type(dialog.getByLabelText('Material name'), 'Nope');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));
    expect(api.requests).toHaveLength(0);
  });
});
