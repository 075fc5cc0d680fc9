import { screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi, type MockResponse } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';
import type { QuoteView } from '../api/get-quotes';
import { CUSTOMERS, DESIGN_12, DESIGN_SUMMARIES, MASKS, testQuote } from './quote-fixtures';

// The quote page of the API contract (backend/src/quotes): engineers read quotes, only admins and
// sales write and send them; a failed send answers 400 and leaves the quote a draft with
// lastSendError set.

function quotePage(
  role: Role,
  quote: MockResponse | MockResponse[],
  extra: Parameters<typeof mockApi>[0] = {},
) {
  const api = mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/quotes/21': quote,
    'GET /api/designs/12': { status: 200, body: DESIGN_12 },
    'GET /api/designs': { status: 200, body: DESIGN_SUMMARIES },
    'GET /api/spec-masks': { status: 200, body: MASKS },
    'GET /api/customers': { status: 200, body: CUSTOMERS },
    'GET /api/reports?designId=12': { status: 200, body: [] },
    'GET /api/quotes': { status: 200, body: [] },
    ...extra,
  });
  const view = renderApp('/quotes/21');
  return { ...view, api };
}

const ok = (q: QuoteView): MockResponse => ({ status: 200, body: q });

describe('quote page', () => {
  it('shows an engineer everything but no edit, attach, send or decision buttons', async () => {
    const { api } = quotePage('engineer', ok(testQuote()));

    expect(await screen.findByRole('heading', { level: 1, name: 'Quote Q-21' })).toBeTruthy();
    const details = screen.getByLabelText('Quote details');
    expect(details.textContent).toContain('buyer@fenwick.example');
    expect(details.textContent).toContain('Ø25 mm lens, AR one side');
    const breaks = screen.getByRole('table', { name: 'Quantity breaks' });
    expect(
      within(breaks)
        .getAllByRole('row')
        .map((r) => r.textContent),
    ).toEqual(['From quantityUnit price (EUR)', '10 pcs42.50', '100 pcs31.00']);
    for (const name of ['Edit', 'Attach reports', 'Send', 'Mark accepted', 'Mark declined']) {
      expect(screen.queryByRole('button', { name })).toBeNull();
    }
    // Nothing is fetched for a form the engineer cannot open.
    expect(api.calls('GET', '/api/designs')).toHaveLength(0);
  });

  it('asks before sending; a failed send shows the error and the quote stays a draft', async () => {
    const failed = testQuote({
      lastSendError: 'connect ECONNREFUSED 127.0.0.1:9',
      history: [
        ...testQuote().history,
        {
          at: '2026-12-02T09:00:00.000Z',
          actor: 'Ines Calder',
          action: 'send failed',
          detail: 'connect ECONNREFUSED 127.0.0.1:9',
        },
      ],
    });
    const { user, api } = quotePage('sales', [ok(testQuote()), ok(failed)], {
      'POST /api/quotes/21/send': apiError(
        400,
        'Bad Request',
        'The e-mail could not be sent; the quote stays a draft: connect ECONNREFUSED 127.0.0.1:9',
      ),
    });

    await user.click(await screen.findByRole('button', { name: 'Send' }));
    const confirm = within(await screen.findByRole('dialog', { name: 'Send quote Q-21?' }));
    expect(
      confirm.getByText(/It goes by e-mail to buyer@fenwick.example with 0 compliance reports attached/),
    ).toBeTruthy();
    await user.click(confirm.getByRole('button', { name: 'Send quote' }));

    const alert = await screen.findByText(
      'The e-mail could not be sent; the quote stays a draft: connect ECONNREFUSED 127.0.0.1:9',
    );
    expect(alert.closest('[role="alert"]')?.textContent).toContain('The quote was not sent');
    await waitFor(() => expect(screen.getByText(/The last send failed/)).toBeTruthy());
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    const details = screen.getByLabelText('Quote details');
    expect(within(details).getByText('draft')).toBeTruthy();
    expect(within(details).queryByText('sent')).toBeNull();
    expect(screen.getByRole('table', { name: 'History' }).textContent).toContain('send failed');
    // Still a draft: it can be sent again, and no decision buttons appear.
    expect(screen.getByRole('button', { name: 'Send' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Mark accepted' })).toBeNull();
    expect(api.calls('POST', '/api/quotes/21/send')).toHaveLength(1);
  });

  it('after a send offers the decision: accepted is posted and shown', async () => {
    const sent = testQuote({ status: 'sent' });
    const { user, api } = quotePage('sales', ok(sent), {
      'POST /api/quotes/21/decision': { status: 201, body: testQuote({ status: 'accepted' }) },
    });
    await user.click(await screen.findByRole('button', { name: 'Mark accepted' }));
    await waitFor(() =>
      expect(within(screen.getByLabelText('Quote details')).getByText('accepted')).toBeTruthy(),
    );
    expect(api.calls('POST', '/api/quotes/21/decision').map((r) => r.body)).toEqual([{ status: 'accepted' }]);
    expect(screen.queryByRole('button', { name: 'Send' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Edit' })).toBeNull();
  });
});
