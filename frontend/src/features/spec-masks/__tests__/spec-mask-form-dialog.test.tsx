import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { useCustomers } from '../../customers/api/get-customers';
import { useNewCustomerPicker } from '../../customers/components/use-new-customer-picker';
import { SpecMaskFormDialog } from '../components/spec-mask-form-dialog';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Answers: POST /spec-masks of the design-workspace API contract; the engine's mask validation
// names the band and field (`bands.1.to_nm: …`), which the form puts on that band's field.

const CUSTOMERS = [
  { id: 3, name: 'Fenwick Optics Lab' },
  { id: 5, name: 'Marlow Scopes' },
];

type User = ReturnType<typeof renderWithProviders>['user'];
type Scope = ReturnType<typeof within>;

function band(n: number): Scope {
  return within(screen.getByRole('group', { name: `Limit band ${n}` }));
}

async function fill(user: User, scope: Scope, label: string, text: string) {
  const field = scope.getByLabelText(label);
  await user.clear(field);
  await user.type(field, text);
}

function describedBy(field: HTMLElement): string {
  return (field.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ')
    .trim();
}

async function openForm() {
  const { user } = renderWithProviders(
    <SpecMaskFormDialog open mask={null} customers={CUSTOMERS} defaultCustomerId={3} onClose={() => {}} />,
  );
  const dialog = within(await screen.findByRole('dialog', { name: 'New spec mask' }));
  await fill(user, dialog, 'Name', 'Fenwick lens AR');
  return { user, dialog };
}

describe('SpecMaskFormDialog', () => {
  // Three bands typed key by key, each change checking its band again: slow on a busy machine.
  it('adds and removes limit bands, and posts the bands that remain', async () => {
    const api = mockApi({
      'POST /api/spec-masks': {
        status: 201,
        body: { id: 9, name: 'Fenwick lens AR', revision: 'A', bands: [] },
      },
      'GET /api/spec-masks': { status: 200, body: [] },
    });
    const onClose = vi.fn();
    const { user } = renderWithProviders(
      <SpecMaskFormDialog open mask={null} customers={CUSTOMERS} defaultCustomerId={3} onClose={onClose} />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'New spec mask' }));
    await fill(user, dialog, 'Name', 'Fenwick lens AR');
    expect(dialog.getAllByRole('group', { name: /^Limit band/ })).toHaveLength(1);
    expect((band(1).getByRole('button', { name: 'Remove band 1' }) as HTMLButtonElement).disabled).toBe(true);

    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Angles (°)', '0, 15, 30');
    await fill(user, band(1), 'Limit (%)', '0.5');

    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    expect(dialog.getAllByRole('group', { name: /^Limit band/ })).toHaveLength(3);
    await fill(user, band(2), 'From (nm)', '1');
    await fill(user, band(2), 'To (nm)', '2');
    await fill(user, band(2), 'Limit (%)', '9');
    await fill(user, band(3), 'From (nm)', '532');
    await fill(user, band(3), 'To (nm)', '532');
    await user.selectOptions(band(3).getByLabelText('Bound'), 'target');
    await fill(user, band(3), 'Limit (%)', '0.2');
    await fill(user, band(3), 'Tolerance (%)', '0.1');
    await fill(user, band(3), 'Label', 'laser line');

    await user.click(band(2).getByRole('button', { name: 'Remove band 2' }));
    expect(dialog.getAllByRole('group', { name: /^Limit band/ })).toHaveLength(2);
    // What was band 3 is band 2 now, with its values.
    expect((band(2).getByLabelText('Label') as HTMLInputElement).value).toBe('laser line');

    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/spec-masks').map((r) => r.body)).toEqual([
      {
        name: 'Fenwick lens AR',
        customerId: 3,
        revision: 'A',
        kind: 'customer',
        notes: '',
        bands: [
          {
            from_nm: 420,
            to_nm: 680,
            angles_deg: [0, 15, 30],
            polarisation: 'avg',
            quantity: 'R',
            max_percent: 0.5,
          },
          {
            from_nm: 532,
            to_nm: 532,
            angles_deg: [0],
            polarisation: 'avg',
            quantity: 'R',
            target_percent: 0.2,
            tolerance_percent: 0.1,
            label: 'laser line',
          },
        ],
      },
    ]);
  }, 60_000);

  it("checks every band before sending with the API's rules, each problem at its field", async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(
      <SpecMaskFormDialog open mask={null} customers={CUSTOMERS} defaultCustomerId={3} onClose={() => {}} />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'New spec mask' }));
    await fill(user, dialog, 'Name', 'Fenwick lens AR');
    await fill(user, band(1), 'From (nm)', '700');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Limit (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await fill(user, band(2), 'From (nm)', '400');
    await fill(user, band(2), 'To (nm)', '500');
    await fill(user, band(2), 'Angles (°)', '0, 95');
    await fill(user, band(2), 'Limit (%)', 'one');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    // Typed text is read first: a number field that is not a number is named before any rule.
    expect(describedBy(band(2).getByLabelText('Limit (%)'))).toBe('Enter a number');
    expect(describedBy(band(1).getByLabelText('From (nm)'))).toBe('');

    await fill(user, band(2), 'Limit (%)', '120');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    expect(describedBy(band(1).getByLabelText('From (nm)'))).toBe('must not exceed to_nm (700 nm > 680 nm)');
    expect(describedBy(band(2).getByLabelText('Angles (°)'))).toBe(
      'angle of incidence must be at least 0° and below 90° (got 95)',
    );
    expect(api.requests).toHaveLength(0);
  });

  it("puts the API's bands.1.to_nm error on band 2's To field", async () => {
    const message = 'bands.1.to_nm: must be greater than 0 (got 0)';
    mockApi({ 'POST /api/spec-masks': apiError(400, 'Bad Request', `Invalid input: ${message}`, [message]) });
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Limit (%)', '0.5');
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await fill(user, band(2), 'From (nm)', '690');
    await fill(user, band(2), 'To (nm)', '700');
    await fill(user, band(2), 'Limit (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));

    const to = band(2).getByLabelText('To (nm)');
    await waitFor(() => expect(to.getAttribute('aria-invalid')).toBe('true'));
    expect(describedBy(to)).toBe('must be greater than 0 (got 0)');
    expect(band(1).getByLabelText('To (nm)').getAttribute('aria-invalid')).toBe('false');
    expect(band(2).getByLabelText('From (nm)').getAttribute('aria-invalid')).toBe('false');
    expect(dialog.getByText('Not saved: the marked fields have problems.')).toBeTruthy();
  });

  it('shows bands that contradict each other on the later band, before sending', async () => {
    const api = mockApi({});
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '400');
    await fill(user, band(1), 'To (nm)', '700');
    await fill(user, band(1), 'Limit (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await fill(user, band(2), 'From (nm)', '450');
    await fill(user, band(2), 'To (nm)', '650');
    await user.selectOptions(band(2).getByLabelText('Bound'), 'min');
    await fill(user, band(2), 'Limit (%)', '2');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));

    expect(
      await band(2).findByText(
        'bands[1] (R ≥ 2 %) contradicts bands[0] (R ≤ 1 %) over 450–650 nm at 0°, avg: no value meets both',
      ),
    ).toBeTruthy();
    expect(band(1).queryByText(/contradicts/)).toBeNull();
    expect(api.requests).toHaveLength(0);
  });

  it('takes an angle range with a step and a design margin, kept apart from the customer limit', async () => {
    const api = mockApi({
      'POST /api/spec-masks': {
        status: 201,
        body: { id: 9, name: 'Fenwick lens AR', revision: 'A', bands: [] },
      },
      'GET /api/spec-masks': { status: 200, body: [] },
    });
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await user.selectOptions(band(1).getByLabelText('Angles given as'), 'range');
    expect(band(1).queryByLabelText('Angles (°)')).toBeNull();
    await fill(user, band(1), 'Angle from (°)', '0');
    await fill(user, band(1), 'Angle to (°)', '20');
    await fill(user, band(1), 'Every (°)', '5');
    await fill(user, band(1), 'Limit (%)', '0.5');
    await fill(user, band(1), 'Design margin', '0.6');
    await user.selectOptions(dialog.getByLabelText('What this mask is'), 'internal');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    // R ≤ 0.5 % with a 0.6-point margin would aim below 0 %: refused before sending.
    expect(describedBy(band(1).getByLabelText('Design margin'))).toBe(
      'puts the design target outside 0–100 % (R ≤ -0.1 %)',
    );
    expect(api.requests).toHaveLength(0);

    await fill(user, band(1), 'Design margin', '0.1');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    await waitFor(() => expect(api.calls('POST', '/api/spec-masks')).toHaveLength(1));
    expect(api.calls('POST', '/api/spec-masks')[0]!.body).toEqual({
      name: 'Fenwick lens AR',
      customerId: 3,
      revision: 'A',
      kind: 'internal',
      notes: '',
      bands: [
        {
          from_nm: 420,
          to_nm: 680,
          angle_from_deg: 0,
          angle_to_deg: 20,
          angle_step_deg: 5,
          polarisation: 'avg',
          quantity: 'R',
          max_percent: 0.5,
          margin_percent: 0.1,
        },
      ],
    });
  });

  it('refuses a step that gives more angles than a band may have, with the engine’s count', async () => {
    const api = mockApi({});
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await user.selectOptions(band(1).getByLabelText('Angles given as'), 'range');
    await fill(user, band(1), 'Angle from (°)', '0');
    await fill(user, band(1), 'Angle to (°)', '89');
    await fill(user, band(1), 'Every (°)', '0.5');
    await fill(user, band(1), 'Limit (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    expect(describedBy(band(1).getByLabelText('Every (°)'))).toMatch(
      /^gives more than 91 angles from 0° to 89°/,
    );
    expect(api.requests).toHaveLength(0);
  });

  it("puts the API's angle-range and margin errors on those fields", async () => {
    const message =
      'bands.0.margin_percent: must be less than tolerance_percent (0.1 %), or no design target is left';
    mockApi({ 'POST /api/spec-masks': apiError(400, 'Bad Request', `Invalid input: ${message}`, [message]) });
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Limit (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));
    const margin = band(1).getByLabelText('Design margin');
    await waitFor(() => expect(margin.getAttribute('aria-invalid')).toBe('true'));
    expect(describedBy(margin)).toBe(
      'must be less than tolerance_percent (0.1 %), or no design target is left',
    );
  });

  it('offers "New customer…": the new customer is created and chosen for the mask', async () => {
    const created = {
      id: 11,
      name: 'Quillon Optics',
      contactEmail: null,
      notes: '',
      contacts: [],
      archivedAt: null,
      version: 1,
    };
    const api = mockApi({
      // The list as it is, then (fetched again after the save) with the new customer.
      'GET /api/customers': [
        { status: 200, body: CUSTOMERS },
        { status: 200, body: [...CUSTOMERS, created] },
      ],
      'POST /api/customers': { status: 201, body: created },
    });
    const { user } = renderWithProviders(<PickerHarness />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New spec mask' }));
    const picker = dialog.getByLabelText('Customer') as HTMLSelectElement;
    await waitFor(() => expect([...picker.options].map((o) => o.textContent)).toContain('New customer…'));
    await user.selectOptions(picker, 'New customer…');
    const form = within(await screen.findByRole('dialog', { name: 'New customer' }));
    await user.type(form.getByLabelText('Name'), 'Quillon Optics');
    await user.click(form.getByRole('button', { name: 'Save customer' }));
    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'New customer' })).toBeNull());
    expect(api.calls('POST', '/api/customers').map((r) => r.body)).toEqual([
      { name: 'Quillon Optics', contactEmail: null, notes: '', contacts: [] },
    ]);
    await waitFor(() => expect(picker.value).toBe('11'));
    expect(picker.selectedOptions[0]!.textContent).toBe('Quillon Optics');
  });
});

/** The mask form as the Spec masks page composes it: customers from the API, "New customer…" on. */
function PickerHarness() {
  const customers = useCustomers();
  const newCustomer = useNewCustomerPicker();
  return (
    <>
      <SpecMaskFormDialog
        open
        mask={null}
        customers={customers.data ?? []}
        defaultCustomerId={null}
        onClose={() => {}}
        onNewCustomer={newCustomer.open}
      />
      {newCustomer.dialog}
    </>
  );
}
