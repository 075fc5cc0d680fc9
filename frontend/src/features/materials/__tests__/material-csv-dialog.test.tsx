import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { MaterialCsvDialog } from '../components/material-csv-dialog';

// Answers: POST /materials/import-csv of the design-workspace API contract — a bad file is 400
// with one `details` entry per bad row and nothing saved; files over 1 MB are refused.

const ROW_PROBLEMS = ['row 3: not a number: n "abc"', 'row 5: k must be ≥ 0 (k > 0 is absorption)'];

function csvFile(text: string, name = 'film.csv'): File {
  return new File([text], name, { type: 'text/csv' });
}

const PREVIEW = {
  table: { wavelengths: [400, 550, 800], n: [2.2013, 2.1204, 2.0811], k: [0.0012, 0, 0] },
  unit: 'um',
  decimalComma: true,
  headerRow: true,
  rangeNm: { from: 400, to: 800 },
};

describe('MaterialCsvDialog', () => {
  it('shows every row problem the API finds in the preview and saves nothing', async () => {
    const api = mockApi({
      'POST /api/materials/import-csv/preview': apiError(
        400,
        'Bad Request',
        `Invalid input: ${ROW_PROBLEMS.join('; ')}`,
        ROW_PROBLEMS,
      ),
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<MaterialCsvDialog open onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Upload n,k file' }));

    const text = 'wavelength_nm,n,k\n400,1.5,0\n500,abc,0\n600,1.48,0\n700,1.47,-0.1\n';
    await user.upload(dialog.getByLabelText('n,k file'), csvFile(text));
    const list = within(await dialog.findByRole('list', { name: 'Problems in the file' }));
    expect(list.getAllByRole('listitem').map((li) => li.textContent)).toEqual(ROW_PROBLEMS);
    expect(api.calls('POST', '/api/materials/import-csv/preview')[0]!.body).toEqual({ csv: text });

    await user.type(dialog.getByLabelText('Material name'), 'Film 17');
    await user.selectOptions(dialog.getByLabelText('Provenance'), 'typical');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));
    expect(api.calls('POST', '/api/materials/import-csv')).toHaveLength(0);
    expect(onClose).not.toHaveBeenCalled();
  });

  it('previews a file with a unit header and decimal commas, then imports it with its provenance and name', async () => {
    const api = mockApi({
      'POST /api/materials/import-csv/preview': { status: 200, body: PREVIEW },
      'POST /api/materials/import-csv': { status: 201, body: { id: 30, name: 'Ta2O5 run 118' } },
      'GET /api/materials': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<MaterialCsvDialog open onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Upload n,k file' }));

    const text = 'Wavelength (µm);n;k\n0,40;2,2013;0,0012\n0,55;2,1204;0\n0,80;2,0811;0\n';
    await user.upload(dialog.getByLabelText('n,k file'), csvFile(text, 'ta2o5 run 118.csv'));
    // The real size, not "0.00 MB".
    expect(dialog.getByText(`ta2o5 run 118.csv, ${new Blob([text]).size} bytes`)).toBeTruthy();
    const preview = within(await dialog.findByRole('region', { name: 'Preview of the n,k table' }));
    expect(preview.getByText('3 rows, 400–800 nm, wavelengths read in µm, decimal commas.')).toBeTruthy();
    const rows = within(preview.getByRole('table', { name: 'Parsed rows' })).getAllByRole('row');
    expect(rows.map((r) => r.textContent)).toEqual([
      'Wavelength (nm)nk',
      '4002.20130.0012',
      '5502.12040',
      '8002.08110',
    ]);

    await user.type(dialog.getByLabelText('Material name'), 'Ta2O5 run 118');
    await user.selectOptions(dialog.getByLabelText('Provenance'), 'measured');
    await user.type(dialog.getByLabelText('Date (YYYY-MM-DD)'), '2026-11-28');
    await user.type(dialog.getByLabelText('Run'), 'B2-2026-118');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));

    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/materials/import-csv')[0]!.body).toEqual({
      name: 'Ta2O5 run 118',
      csv: text,
      interpolation: 'linear',
      clamp: false,
      fileName: 'ta2o5 run 118.csv',
      typical: false,
      provenance: { kind: 'measured', source: '', notes: '', date: '2026-11-28', run: 'B2-2026-118' },
    });
  });

  it('sends a chosen unit as "um" with the preview', async () => {
    const api = mockApi({
      'POST /api/materials/import-csv/preview': { status: 200, body: { ...PREVIEW, decimalComma: false } },
    });
    const { user } = renderWithProviders(<MaterialCsvDialog open onClose={() => {}} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Upload n,k file' }));
    await user.upload(dialog.getByLabelText('n,k file'), csvFile('0.4,1.5\n0.8,1.45\n'));
    await user.selectOptions(dialog.getByLabelText('Wavelength unit'), 'um');
    await waitFor(() =>
      expect(api.calls('POST', '/api/materials/import-csv/preview').at(-1)?.body).toEqual({
        csv: '0.4,1.5\n0.8,1.45\n',
        unit: 'um',
      }),
    );
  });

  it('refuses a file over 1 MB before sending it', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<MaterialCsvDialog open onClose={() => {}} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Upload n,k file' }));

    await user.upload(dialog.getByLabelText('n,k file'), csvFile('9'.repeat(1_000_001), 'huge.csv'));
    await user.type(dialog.getByLabelText('Material name'), 'Huge');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));

    expect(
      dialog.getByText('The file is larger than 1 MB (1.00 MB); split it or thin out its rows.'),
    ).toBeTruthy();
    expect(dialog.getByLabelText('n,k file').getAttribute('aria-invalid')).toBe('true');
    expect(api.requests).toHaveLength(0);
  });
});
