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

describe('MaterialCsvDialog', () => {
  it('shows every row problem the API reports and saves nothing', async () => {
    const api = mockApi({
      'POST /api/materials/import-csv': apiError(
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
    await user.type(dialog.getByLabelText('Material name'), 'Film 17');
    await user.selectOptions(dialog.getByLabelText('Wavelength unit'), 'nm');
    await user.selectOptions(dialog.getByLabelText('Interpolation'), 'pchip');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));

    const list = within(await dialog.findByRole('list', { name: 'Problems in the file' }));
    expect(list.getAllByRole('listitem').map((li) => li.textContent)).toEqual(ROW_PROBLEMS);
    expect(dialog.getByRole('alert').textContent).toContain('Nothing was saved');
    expect(api.calls('POST', '/api/materials/import-csv').map((r) => r.body)).toEqual([
      { name: 'Film 17', csv: text, unit: 'nm', interpolation: 'pchip', typical: false },
    ]);
    expect(onClose).not.toHaveBeenCalled();
  });

  it('sends µm as "um" and closes after a successful import', async () => {
    const api = mockApi({
      'POST /api/materials/import-csv': { status: 201, body: { id: 30, name: 'Film 18' } },
      'GET /api/materials': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(<MaterialCsvDialog open onClose={onClose} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'Upload n,k file' }));

    await user.upload(dialog.getByLabelText('n,k file'), csvFile('0.4,1.5\n0.8,1.45\n'));
    await user.type(dialog.getByLabelText('Material name'), 'Film 18');
    await user.selectOptions(dialog.getByLabelText('Wavelength unit'), 'um');
    await user.click(dialog.getByRole('button', { name: 'Import material' }));

    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/materials/import-csv')[0].body).toMatchObject({
      unit: 'um',
      csv: '0.4,1.5\n0.8,1.45\n',
    });
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
