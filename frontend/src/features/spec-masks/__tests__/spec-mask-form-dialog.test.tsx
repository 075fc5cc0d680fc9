import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { SpecMaskFormDialog } from '../components/spec-mask-form-dialog';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Answers: POST /spec-masks of the design-workspace API contract; the engine's mask validation
// names the band and field (`bands[1].to_nm: …`), which the form puts on that band's field.

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
    await fill(user, band(1), 'Value (%)', '0.5');

    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    expect(dialog.getAllByRole('group', { name: /^Limit band/ })).toHaveLength(3);
    await fill(user, band(2), 'From (nm)', '1');
    await fill(user, band(2), 'To (nm)', '2');
    await fill(user, band(2), 'Value (%)', '9');
    await fill(user, band(3), 'From (nm)', '532');
    await fill(user, band(3), 'To (nm)', '532');
    await user.selectOptions(band(3).getByLabelText('Bound'), 'target');
    await fill(user, band(3), 'Value (%)', '0.2');
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
  });

  it('checks a band before sending: To below From, a bad angle, a bound over 100 %', async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(
      <SpecMaskFormDialog open mask={null} customers={CUSTOMERS} defaultCustomerId={3} onClose={() => {}} />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'New spec mask' }));
    await fill(user, dialog, 'Name', 'Fenwick lens AR');
    await fill(user, band(1), 'From (nm)', '700');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Angles (°)', '0, 95');
    await fill(user, band(1), 'Value (%)', '120');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));

    expect(describedBy(band(1).getByLabelText('To (nm)'))).toBe('Must not be below From (700 nm)');
    expect(describedBy(band(1).getByLabelText('Angles (°)'))).toBe('Each angle from 0 to below 90°');
    expect(describedBy(band(1).getByLabelText('Value (%)'))).toBe('A percentage from 0 to 100');
    expect(api.requests).toHaveLength(0);
  });

  it("puts the API's bands[1].to_nm error on band 2's To field", async () => {
    const message = 'bands[1].to_nm: must be a number > 0 (got 0)';
    mockApi({ 'POST /api/spec-masks': apiError(400, 'Bad Request', `Invalid input: ${message}`, [message]) });
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '420');
    await fill(user, band(1), 'To (nm)', '680');
    await fill(user, band(1), 'Value (%)', '0.5');
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await fill(user, band(2), 'From (nm)', '690');
    await fill(user, band(2), 'To (nm)', '700');
    await fill(user, band(2), 'Value (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));

    const to = band(2).getByLabelText('To (nm)');
    await waitFor(() => expect(to.getAttribute('aria-invalid')).toBe('true'));
    expect(describedBy(to)).toBe('must be a number > 0 (got 0)');
    expect(band(1).getByLabelText('To (nm)').getAttribute('aria-invalid')).toBe('false');
    expect(band(2).getByLabelText('From (nm)').getAttribute('aria-invalid')).toBe('false');
    expect(dialog.getByText('Not saved: the marked fields have problems.')).toBeTruthy();
  });

  it('shows a band-level API error (contradicting bands) on that band', async () => {
    const message =
      'bands[1]: bands[1] (R ≥ 2 %) contradicts bands[0] (R ≤ 1 %) over 450–650 nm at 0°, avg: no value meets both';
    mockApi({ 'POST /api/spec-masks': apiError(400, 'Bad Request', `Invalid input: ${message}`, [message]) });
    const { user, dialog } = await openForm();
    await fill(user, band(1), 'From (nm)', '400');
    await fill(user, band(1), 'To (nm)', '700');
    await fill(user, band(1), 'Value (%)', '1');
    await user.click(dialog.getByRole('button', { name: 'Add band' }));
    await fill(user, band(2), 'From (nm)', '450');
    await fill(user, band(2), 'To (nm)', '650');
    await user.selectOptions(band(2).getByLabelText('Bound'), 'min');
    await fill(user, band(2), 'Value (%)', '2');
    await user.click(dialog.getByRole('button', { name: 'Save mask' }));

    expect(
      await band(2).findByText(
        'bands[1] (R ≥ 2 %) contradicts bands[0] (R ≤ 1 %) over 450–650 nm at 0°, avg: no value meets both',
      ),
    ).toBeTruthy();
    expect(band(1).queryByText(/contradicts/)).toBeNull();
  });
});
