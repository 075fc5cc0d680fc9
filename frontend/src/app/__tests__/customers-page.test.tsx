import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../test/fixtures';
import { apiError, mockApi } from '../../test/mock-api';
import { renderApp } from '../../test/render';

// The customers API (backend/src/customers): contacts need a valid e-mail; archive and restore send
// the version token; GET /customers leaves archived customers out unless includeArchived=true.

const QUILLON = {
  id: 4,
  name: 'Quillon Optics',
  contactEmail: 'buyer@quillon.example',
  notes: '',
  contacts: [{ name: 'Ona Vell', email: 'ona@quillon.example', role: 'purchasing' }],
  archivedAt: null,
  version: 2,
};
const RECORDS = {
  masks: [
    { id: 6, title: 'QO-100 window rev A', status: 'customer', at: '2026-12-01T10:00:00.000Z' },
    { id: 8, title: 'QO-100 window tight rev T', status: 'internal', at: '2026-12-01T11:00:00.000Z' },
  ],
  designs: [{ id: 12, title: 'QO-100 window AR', status: 'approved', at: '2026-12-01T12:00:00.000Z' }],
  reports: [],
  quotes: [{ id: 21, title: 'Q-21: Ø25 window', status: 'draft', at: '2026-12-02T09:00:00.000Z' }],
};

const session = { status: 200, body: { user: STAFF.sales } };

describe('Customers page', () => {
  it("lists customers with their contacts and shows one's masks (marked by kind), designs, reports and quotes", async () => {
    mockApi({
      'GET /api/auth/session': session,
      'GET /api/customers': { status: 200, body: [QUILLON] },
      'GET /api/customers/4/records': { status: 200, body: RECORDS },
    });
    const { user } = renderApp('/customers');
    const table = await screen.findByRole('table', { name: 'Customers' });
    const row = within(table).getAllByRole('row')[1]!;
    expect(within(row).getByText('Ona Vell <ona@quillon.example>')).toBeTruthy();
    expect(within(row).getByText('Active')).toBeTruthy();
    await user.click(within(row).getByRole('button', { name: 'Show records of Quillon Optics' }));
    const records = await screen.findByRole('region', { name: 'Records of Quillon Optics' });
    const masks = within(records).getByRole('region', { name: 'Spec masks' });
    expect(within(masks).getByText(/^Customer specification ·/)).toBeTruthy();
    expect(within(masks).getByText(/^Internal design target ·/)).toBeTruthy();
    expect(within(records).getByRole('link', { name: 'QO-100 window AR' }).getAttribute('href')).toBe(
      '/designs/12',
    );
    expect(within(records).getByRole('link', { name: 'Q-21: Ø25 window' }).getAttribute('href')).toBe(
      '/quotes/21',
    );
    expect(
      within(within(records).getByRole('region', { name: 'Compliance reports' })).getByText('None yet.'),
    ).toBeTruthy();
  });

  it('creates a customer with a contact; a bad contact e-mail is refused before sending', async () => {
    const api = mockApi({
      'GET /api/auth/session': session,
      'GET /api/customers': { status: 200, body: [] },
      'POST /api/customers': { status: 201, body: { ...QUILLON, version: 1 } },
    });
    const { user } = renderApp('/customers');
    await user.click(await screen.findByRole('button', { name: 'New customer' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'New customer' }));
    await user.type(dialog.getByLabelText('Name'), 'Quillon Optics');
    await user.type(dialog.getByLabelText('Quote e-mail'), 'buyer@quillon.example');
    await user.click(dialog.getByRole('button', { name: 'Add contact' }));
    const contact = within(dialog.getByRole('group', { name: 'Contact 1' }));
    await user.type(contact.getByLabelText('Contact name'), 'Ona Vell');
    await user.type(contact.getByLabelText('E-mail'), 'ona at quillon');
    await user.type(contact.getByLabelText('Role'), 'purchasing');
    await user.click(dialog.getByRole('button', { name: 'Save customer' }));
    expect(await contact.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(api.calls('POST', '/api/customers')).toHaveLength(0);

    await user.clear(contact.getByLabelText('E-mail'));
    await user.type(contact.getByLabelText('E-mail'), 'ona@quillon.example');
    await user.click(dialog.getByRole('button', { name: 'Save customer' }));
    await waitFor(() => expect(api.calls('POST', '/api/customers')).toHaveLength(1));
    expect(api.calls('POST', '/api/customers')[0]!.body).toEqual({
      name: 'Quillon Optics',
      contactEmail: 'buyer@quillon.example',
      notes: '',
      contacts: [{ name: 'Ona Vell', email: 'ona@quillon.example', role: 'purchasing' }],
    });
  });

  it("shows the API's own messages under the fields and sends nothing", async () => {
    const api = mockApi({
      'GET /api/auth/session': session,
      'GET /api/customers': { status: 200, body: [] },
    });
    const { user } = renderApp('/customers');
    await user.click(await screen.findByRole('button', { name: 'New customer' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'New customer' }));
    await user.type(dialog.getByLabelText('Name'), '   ');
    await user.type(dialog.getByLabelText('Quote e-mail'), 'buyer at quillon');
    await user.click(dialog.getByRole('button', { name: 'Add contact' }));
    const contact = within(dialog.getByRole('group', { name: 'Contact 1' }));
    await user.type(contact.getByLabelText('E-mail'), 'ona@quillon.example');
    await user.type(contact.getByLabelText('Phone'), '1'.repeat(41));
    await user.click(dialog.getByRole('button', { name: 'Save customer' }));
    expect(await dialog.findByText('Enter a customer name')).toBeTruthy();
    expect(dialog.getByText('Enter a valid e-mail address')).toBeTruthy();
    expect(contact.getByText("Enter the contact's name")).toBeTruthy();
    expect(contact.getByText('At most 40 characters')).toBeTruthy();
    expect(api.calls('POST', '/api/customers')).toHaveLength(0);
  });

  it('shows the API refusal of a duplicate name and keeps the dialog open', async () => {
    mockApi({
      'GET /api/auth/session': session,
      'GET /api/customers': { status: 200, body: [QUILLON] },
      'POST /api/customers': apiError(409, 'Conflict', 'A customer named "Quillon Optics" already exists'),
    });
    const { user } = renderApp('/customers');
    await user.click(await screen.findByRole('button', { name: 'New customer' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'New customer' }));
    await user.type(dialog.getByLabelText('Name'), 'Quillon Optics');
    await user.click(dialog.getByRole('button', { name: 'Save customer' }));
    expect(await dialog.findByText('A customer named "Quillon Optics" already exists')).toBeTruthy();
  });

  it('archives with the version token after asking, and lists archived customers on request', async () => {
    const archived = { ...QUILLON, archivedAt: '2026-12-02T10:00:00.000Z', version: 3 };
    const api = mockApi({
      'GET /api/auth/session': session,
      'GET /api/customers': [
        { status: 200, body: [QUILLON] },
        { status: 200, body: [] },
      ],
      'GET /api/customers?includeArchived=true': { status: 200, body: [archived] },
      'POST /api/customers/4/archive': { status: 201, body: archived },
    });
    const { user } = renderApp('/customers');
    await user.click(await screen.findByRole('button', { name: 'Archive Quillon Optics' }));
    const confirm = within(await screen.findByRole('dialog', { name: 'Archive Quillon Optics?' }));
    expect(confirm.getByText(/hidden from every picker/)).toBeTruthy();
    await user.click(confirm.getByRole('button', { name: 'Archive' }));
    await waitFor(() => expect(api.calls('POST', '/api/customers/4/archive')).toHaveLength(1));
    expect(api.calls('POST', '/api/customers/4/archive')[0]!.body).toEqual({ version: 2 });
    await waitFor(() => expect(screen.queryByRole('button', { name: 'Archive Quillon Optics' })).toBeNull());

    await user.click(screen.getByLabelText('Show archived customers'));
    const row = within(await screen.findByRole('table', { name: 'Customers' })).getAllByRole('row')[1]!;
    expect(await within(row).findByText('Archived')).toBeTruthy();
    expect(within(row).getByRole('button', { name: 'Restore Quillon Optics' })).toBeTruthy();
  });
});
