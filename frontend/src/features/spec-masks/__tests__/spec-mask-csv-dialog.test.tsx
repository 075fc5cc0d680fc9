import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { SpecMaskCsvDialog } from '../components/spec-mask-csv-dialog';

// Answers: POST /spec-masks/import-csv of the design-workspace API contract — the mask's details
// with the file's text; the API reads the rows.

const CUSTOMERS = [
  { id: 3, name: 'Fenwick Optics Lab' },
  { id: 5, name: 'Marlow Scopes' },
];
const CSV = 'from_nm,to_nm,quantity,max_percent\n420,680,R,0.5\n';

function describedBy(field: HTMLElement): string {
  return (field.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ')
    .trim();
}

describe('SpecMaskCsvDialog', () => {
  it("checks the details with the API's rules, then posts them trimmed with the file's text", async () => {
    const api = mockApi({
      'POST /api/spec-masks/import-csv': {
        status: 201,
        body: { id: 12, name: 'Fenwick lens AR', revision: 'B', bands: [{}] },
      },
      'GET /api/spec-masks': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(
      <SpecMaskCsvDialog open customers={CUSTOMERS} defaultCustomerId={null} onClose={onClose} />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'Import spec mask' }));
    await user.upload(
      dialog.getByLabelText('Spec mask file'),
      new File([CSV], 'mask.csv', { type: 'text/csv' }),
    );
    await user.type(dialog.getByLabelText('Name'), '   ');
    await user.click(dialog.getByRole('button', { name: 'Import mask' }));
    expect(describedBy(dialog.getByLabelText('Name'))).toBe('Enter a name');
    expect(describedBy(dialog.getByLabelText('Customer'))).toBe('Choose the customer');
    expect(api.requests).toHaveLength(0);

    await user.type(dialog.getByLabelText('Name'), 'Fenwick lens AR ');
    await user.selectOptions(dialog.getByLabelText('Customer'), '5');
    await user.clear(dialog.getByLabelText('Revision'));
    await user.type(dialog.getByLabelText('Revision'), 'B');
    await user.click(dialog.getByRole('button', { name: 'Import mask' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/spec-masks/import-csv').map((r) => r.body)).toEqual([
      { name: 'Fenwick lens AR', customerId: 5, revision: 'B', kind: 'customer', notes: '', csv: CSV },
    ]);
  });
});
