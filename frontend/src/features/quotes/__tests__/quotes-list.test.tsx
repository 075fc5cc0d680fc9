import { screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@quietglass/shared';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';
import { CUSTOMERS, DESIGN_SUMMARIES, MASKS, testQuote } from './quote-fixtures';

const QUOTES = [
  testQuote({ id: 21 }),
  testQuote({ id: 22, status: 'sent', partDescription: 'Window 40 × 30 mm' }),
  testQuote({
    id: 23,
    status: 'sent',
    customer: { id: 5, name: 'Marlow Scopes' },
    partDescription: 'Scope window',
  }),
];

function quotesPage(role: Role) {
  const api = mockApi({
    'GET /api/auth/session': { status: 200, body: { user: STAFF[role] } },
    'GET /api/quotes': { status: 200, body: QUOTES },
    'GET /api/designs': { status: 200, body: DESIGN_SUMMARIES },
    'GET /api/spec-masks': { status: 200, body: MASKS },
    'GET /api/customers': { status: 200, body: CUSTOMERS },
  });
  return { ...renderApp('/quotes'), api };
}

/** The quote numbers in the grid, top to bottom. */
function listedQuotes(): string[] {
  const grid = screen.getByRole('grid', { name: 'Quotes' });
  return within(grid)
    .queryAllByRole('link')
    .map((a) => a.textContent ?? '');
}

describe('quotes list', () => {
  it('filters by status and by customer', async () => {
    const { user } = quotesPage('sales');
    await waitFor(() => expect(listedQuotes()).toEqual(['Q-23', 'Q-22', 'Q-21']));
    expect(screen.getByRole('button', { name: 'New quote' })).toBeTruthy();

    await user.selectOptions(screen.getByLabelText('Status'), 'sent');
    await waitFor(() => expect(listedQuotes()).toEqual(['Q-23', 'Q-22']));
    await user.selectOptions(screen.getByLabelText('Customer'), '3');
    await waitFor(() => expect(listedQuotes()).toEqual(['Q-22']));
    await user.selectOptions(screen.getByLabelText('Status'), '');
    await waitFor(() => expect(listedQuotes()).toEqual(['Q-22', 'Q-21']));
  });

  it('gives engineers the list without a "New quote" button', async () => {
    const { api } = quotesPage('engineer');
    await waitFor(() => expect(listedQuotes()).toEqual(['Q-23', 'Q-22', 'Q-21']));
    expect(screen.queryByRole('button', { name: 'New quote' })).toBeNull();
    expect(api.calls('GET', '/api/designs')).toHaveLength(0);
  });
});
