import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { TEST_DESIGN, TEST_MATERIALS } from '../../../test/design-fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { NewDesignDialog } from '../components/new-design-dialog';

// Answers: POST /designs of the design-workspace API contract (CreateDesignDto; 400 with details
// such as "specMaskId: spec mask 4 belongs to X, not to this design's customer").

const CUSTOMERS = [
  { id: 3, name: 'Fenwick Optics Lab' },
  { id: 5, name: 'Marlow Scopes' },
];
const MASKS = [
  { id: 6, name: 'Fenwick lens AR', revision: 'A', customer: { id: 3 }, kind: 'customer' as const },
  { id: 7, name: 'Marlow window', revision: 'B', customer: { id: 5 }, kind: 'customer' as const },
  // A design may aim at the shop's own target; the picker says which mask is which.
  { id: 8, name: 'Fenwick lens AR tight', revision: 'T', customer: { id: 3 }, kind: 'internal' as const },
];

function renderDialog(onCreated = vi.fn()) {
  const view = renderWithProviders(
    <NewDesignDialog
      open
      onClose={() => {}}
      onCreated={onCreated}
      customers={CUSTOMERS}
      specMasks={MASKS}
      materials={TEST_MATERIALS}
    />,
  );
  return { ...view, onCreated };
}

describe('NewDesignDialog', () => {
  it("offers only the chosen customer's masks and posts the design with an empty layer list", async () => {
    const api = mockApi({
      'POST /api/designs': { status: 201, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user, onCreated } = renderDialog();
    const dialog = within(await screen.findByRole('dialog', { name: 'New design' }));

    await user.type(dialog.getByLabelText('Name'), 'Lens AR trial');
    await user.selectOptions(dialog.getByLabelText('Customer'), '5');
    const maskSelect = dialog.getByLabelText('Spec mask') as HTMLSelectElement;
    expect([...maskSelect.options].map((o) => o.textContent)).toEqual([
      'No spec mask',
      'Marlow window rev B',
    ]);
    await user.selectOptions(dialog.getByLabelText('Customer'), '3');
    expect([...maskSelect.options].map((o) => o.textContent)).toEqual([
      'No spec mask',
      'Fenwick lens AR rev A',
      'Fenwick lens AR tight rev T (internal design target)',
    ]);
    await user.selectOptions(maskSelect, '6');
    expect((dialog.getByLabelText('Incident medium') as HTMLSelectElement).value).toBe('1');
    await user.selectOptions(dialog.getByLabelText('Substrate'), '2');
    await user.type(dialog.getByLabelText('Substrate thickness (mm)'), '2');
    await user.click(dialog.getByRole('button', { name: 'Create design' }));

    await waitFor(() => expect(onCreated).toHaveBeenCalledWith(TEST_DESIGN));
    expect(api.calls('POST', '/api/designs').map((r) => r.body)).toEqual([
      {
        name: 'Lens AR trial',
        customerId: 3,
        specMaskId: 6,
        incidentMaterialId: 1,
        substrateMaterialId: 2,
        substrateThicknessMm: 2,
        backSurface: 'front-only',
        referenceWavelengthNm: 550,
        notes: '',
        layers: [],
      },
    ]);
  });

  it('checks the substrate thickness and reference wavelength and shows API details', async () => {
    const api = mockApi({
      'POST /api/designs': apiError(
        400,
        'Bad Request',
        'Invalid input: substrateMaterialId: material 2 does not exist',
        ['substrateMaterialId: material 2 does not exist'],
      ),
    });
    const { user } = renderDialog();
    const dialog = within(await screen.findByRole('dialog', { name: 'New design' }));
    await user.type(dialog.getByLabelText('Name'), 'Lens AR trial');
    await user.selectOptions(dialog.getByLabelText('Customer'), '3');
    await user.selectOptions(dialog.getByLabelText('Substrate'), '2');
    await user.type(dialog.getByLabelText('Substrate thickness (mm)'), '-1');
    const reference = dialog.getByLabelText('Reference wavelength (nm)');
    await user.clear(reference);
    await user.type(reference, '50');
    await user.click(dialog.getByRole('button', { name: 'Create design' }));

    expect(dialog.getByText('Must be greater than 0 mm')).toBeTruthy();
    expect(dialog.getByText('Must be from 100 to 20000 nm')).toBeTruthy();
    expect(api.requests).toHaveLength(0);

    await user.clear(dialog.getByLabelText('Substrate thickness (mm)'));
    await user.type(dialog.getByLabelText('Substrate thickness (mm)'), '1.1');
    await user.clear(reference);
    await user.type(reference, '550');
    await user.click(dialog.getByRole('button', { name: 'Create design' }));
    expect((await dialog.findByRole('alert')).textContent).toContain(
      'substrateMaterialId: material 2 does not exist',
    );
  });
});
