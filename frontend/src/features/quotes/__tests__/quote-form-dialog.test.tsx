import { todayUtc } from '@quietglass/shared';
import { act, screen, waitFor, within } from '@testing-library/react';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf } from '../../../test/queries';
import { renderWithProviders } from '../../../test/render';
import type { QuoteView } from '../api/get-quotes';
import { QuoteFormDialog } from '../components/quote-form-dialog';
import { daysFromToday } from '../quote-form';
import { CUSTOMERS, DESIGN_12, DESIGN_SUMMARIES, MASKS, testQuote } from './quote-fixtures';

// The form checks the API's own quote schema (shared/src/schemas/quotes.ts): unit prices not
// negative, validity date after today (UTC), quantities rising from break to break; it offers
// approved or released versions only.

/** The form as a route uses it: it fetches the chosen design's versions (here: design 12's). */
function Harness({ quote, onSaved }: { quote: QuoteView | null; onSaved: (q: QuoteView) => void }) {
  const [designId, setDesignId] = useState<number | null>(null);
  return (
    <QuoteFormDialog
      open
      quote={quote}
      onClose={() => {}}
      onSaved={onSaved}
      customers={CUSTOMERS}
      designs={DESIGN_SUMMARIES}
      masks={MASKS}
      versions={designId === 12 ? DESIGN_12.versions : undefined}
      onDesignChange={setDesignId}
    />
  );
}

function renderForm(quote: QuoteView | null = null) {
  const onSaved = vi.fn();
  const view = renderWithProviders(<Harness quote={quote} onSaved={onSaved} />);
  return { ...view, onSaved };
}

function optionTexts(select: HTMLElement): string[] {
  return [...(select as HTMLSelectElement).options].map((o) => o.textContent ?? '');
}

describe('QuoteFormDialog', () => {
  it('offers only approved and released versions of the chosen design, and posts the quote', async () => {
    const validUntil = daysFromToday(30);
    const api = mockApi({
      'POST /api/quotes': { status: 201, body: testQuote({ id: 30 }) },
      'GET /api/quotes': { status: 200, body: [] },
    });
    const { user, onSaved } = renderForm();
    const dialog = within(await screen.findByRole('dialog', { name: 'New quote' }));

    await user.selectOptions(dialog.getByLabelText('Customer'), '3');
    // The customer's own contact address is the first guess.
    expect((dialog.getByLabelText('Contact e-mail') as HTMLInputElement).value).toBe('buyer@fenwick.example');
    expect(optionTexts(dialog.getByLabelText('Design'))).toEqual(['Choose…', 'Fenwick lens AR']);
    await user.selectOptions(dialog.getByLabelText('Design'), '12');
    await waitFor(() =>
      expect(optionTexts(dialog.getByLabelText('Approved version'))).toEqual([
        'Choose…',
        'Version 2 (released)',
        'Version 3 (approved)',
      ]),
    );
    // The design's own mask is chosen with it.
    expect((dialog.getByLabelText('Spec mask') as HTMLSelectElement).value).toBe('6');
    await user.selectOptions(dialog.getByLabelText('Approved version'), '3');
    await user.type(dialog.getByLabelText('Part description'), 'Ø25 mm lens, AR one side');
    await user.type(dialog.getByLabelText('From quantity (break 1)'), '10');
    await user.type(dialog.getByLabelText('Unit price (break 1)'), '42.5');
    await user.click(dialog.getByRole('button', { name: 'Add quantity break' }));
    await user.type(dialog.getByLabelText('From quantity (break 2)'), '100');
    await user.type(dialog.getByLabelText('Unit price (break 2)'), '31');
    await user.type(dialog.getByLabelText('Lead time (days)'), '21');
    await user.clear(dialog.getByLabelText('Valid until'));
    await user.type(dialog.getByLabelText('Valid until'), validUntil);
    await user.click(dialog.getByRole('button', { name: 'Create quote' }));

    await waitFor(() => expect(onSaved).toHaveBeenCalledTimes(1));
    expect(api.calls('POST', '/api/quotes').map((r) => r.body)).toEqual([
      {
        customerId: 3,
        contactEmail: 'buyer@fenwick.example',
        designId: 12,
        versionNumber: 3,
        specMaskId: 6,
        partDescription: 'Ø25 mm lens, AR one side',
        quantityBreaks: [
          { minQuantity: 10, unitPrice: 42.5 },
          { minQuantity: 100, unitPrice: 31 },
        ],
        currency: 'EUR',
        leadTimeDays: 21,
        validUntil,
        terms: '',
      },
    ]);
  });

  it('refuses a negative unit price, a past validity date and falling quantities, and sends nothing', async () => {
    const api = mockApi({});
    const { user } = renderForm(testQuote());
    const dialog = within(await screen.findByRole('dialog', { name: 'Edit quote Q-21' }));

    await user.clear(dialog.getByLabelText('Unit price (break 1)'));
    await user.type(dialog.getByLabelText('Unit price (break 1)'), '-5');
    await user.clear(dialog.getByLabelText('From quantity (break 2)'));
    await user.type(dialog.getByLabelText('From quantity (break 2)'), '5');
    await user.clear(dialog.getByLabelText('Valid until'));
    await user.type(dialog.getByLabelText('Valid until'), '2020-01-01');
    await user.click(dialog.getByRole('button', { name: 'Save quote' }));

    await waitFor(() =>
      expect(descriptionOf('Unit price (break 1)')).toBe('The unit price must not be negative'),
    );
    expect(descriptionOf('Valid until')).toBe(
      `The validity date must be in the future (after ${todayUtc()})`,
    );
    expect(descriptionOf('From quantity (break 2)')).toBe(
      'Each break needs a larger quantity than the one before',
    );
    expect(api.requests).toHaveLength(0);
  });

  it("an empty new quote shows the API's messages under its fields", async () => {
    const api = mockApi({});
    const { user } = renderForm();
    const dialog = within(await screen.findByRole('dialog', { name: 'New quote' }));
    await user.type(dialog.getByLabelText('Unit price (break 1)'), '1.23456');
    await user.clear(dialog.getByLabelText('Currency'));
    await user.type(dialog.getByLabelText('Currency'), 'eur');
    await user.click(dialog.getByRole('button', { name: 'Create quote' }));

    await waitFor(() => expect(descriptionOf('Customer')).toBe('Choose the customer'));
    expect(descriptionOf('Contact e-mail')).toBe('Enter an e-mail address');
    expect(descriptionOf('Part description')).toBe('Describe the part');
    expect(descriptionOf('From quantity (break 1)')).toBe('Enter a quantity');
    expect(descriptionOf('Unit price (break 1)')).toBe('At most 4 decimals');
    expect(descriptionOf('Currency')).toBe('A three-letter ISO 4217 code such as EUR or USD');
    expect(descriptionOf('Lead time (days)')).toBe('Enter the lead time in days');
    expect(api.requests).toHaveLength(0);
  });

  it('refuses today as the validity date, and keeps at least one quantity break', async () => {
    mockApi({});
    const { user } = renderForm(testQuote({ quantityBreaks: [{ minQuantity: 10, unitPrice: 1 }] }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Edit quote Q-21' }));

    expect((dialog.getByRole('button', { name: 'Remove break 1' }) as HTMLButtonElement).disabled).toBe(true);
    await user.clear(dialog.getByLabelText('Valid until'));
    await user.type(dialog.getByLabelText('Valid until'), todayUtc());
    await user.click(dialog.getByRole('button', { name: 'Save quote' }));
    await waitFor(() =>
      expect(descriptionOf('Valid until')).toBe(
        `The validity date must be in the future (after ${todayUtc()})`,
      ),
    );
  });

  it("shows the server's 400 messages and keeps the dialog open", async () => {
    const api = mockApi({
      'PUT /api/quotes/21': apiError(
        400,
        'Bad Request',
        'Invalid input: specMaskId: spec mask 6 belongs to another customer',
        [
          'specMaskId: spec mask 6 belongs to another customer',
          'designId: design 12 belongs to another customer',
        ],
      ),
    });
    const { user, onSaved } = renderForm(testQuote());
    const dialog = within(await screen.findByRole('dialog', { name: 'Edit quote Q-21' }));
    await user.click(dialog.getByRole('button', { name: 'Save quote' }));

    const alert = await dialog.findByRole('alert');
    expect(alert.textContent).toContain('The quote was not saved');
    expect(
      within(alert)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual([
      'specMaskId: spec mask 6 belongs to another customer',
      'designId: design 12 belongs to another customer',
    ]);
    // The edit carries the version it started from (optimistic locking).
    expect(api.calls('PUT', '/api/quotes/21')[0]!.body).toMatchObject({ version: 1, versionNumber: 3 });
    expect(onSaved).not.toHaveBeenCalled();
  });

  it('offers the customer\'s specifications only, and "New customer…" that chooses the customer it made', async () => {
    const onNewCustomer = vi.fn();
    const { user } = renderWithProviders(
      <QuoteFormDialog
        open
        quote={null}
        onClose={() => {}}
        onSaved={() => {}}
        customers={CUSTOMERS}
        designs={DESIGN_SUMMARIES}
        masks={MASKS}
        versions={undefined}
        onDesignChange={() => {}}
        onNewCustomer={onNewCustomer}
      />,
    );
    const dialog = within(await screen.findByRole('dialog', { name: 'New quote' }));
    await user.selectOptions(dialog.getByLabelText('Customer'), '3');
    // Fenwick's internal design target (mask 8) is not offered.
    expect(optionTexts(dialog.getByLabelText('Spec mask'))).toEqual(['Choose…', 'Fenwick lens AR rev A']);
    await user.selectOptions(dialog.getByLabelText('Customer'), 'New customer…');
    expect(onNewCustomer).toHaveBeenCalledTimes(1);
    // Choosing "New customer…" leaves the picker as it was until a customer is made.
    expect((dialog.getByLabelText('Customer') as HTMLSelectElement).value).toBe('3');
    const choose = onNewCustomer.mock.calls[0]![0] as (c: { id: number; name: string }) => void;
    act(() => choose({ id: 5, name: 'Marlow Scopes' }));
    expect((dialog.getByLabelText('Customer') as HTMLSelectElement).value).toBe('5');
  });
});
