import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { descriptionOf, isInvalid } from '../../../test/queries';
import { renderApp, renderWithProviders } from '../../../test/render';
import { StartRunDialog } from '../components/start-run-dialog';
import { CHAMBERS, RECIPES, testRun } from './run-fixtures';

// The shared start-run schema: designId, versionNumber, chamberId ids; lotNumber 1–60 characters
// after trim; runDate a calendar day written YYYY-MM-DD. The API answers 400 with `details` for a recipe that is not released.

function renderDialog(onStarted = vi.fn()) {
  const view = renderWithProviders(
    <StartRunDialog
      open
      recipes={RECIPES}
      chambers={CHAMBERS}
      operatorName="Jonah Pell"
      onClose={() => {}}
      onStarted={onStarted}
    />,
  );
  return { ...view, dialog: within(screen.getByRole('dialog', { name: 'Start a run' })) };
}

describe('StartRunDialog', () => {
  it('names every missing field and sends nothing', async () => {
    const api = mockApi({});
    const { user, dialog } = renderDialog();

    await user.clear(dialog.getByLabelText('Run date'));
    await user.click(dialog.getByRole('button', { name: 'Start run' }));

    await waitFor(() => expect(isInvalid('Released recipe')).toBe(true));
    expect(descriptionOf('Released recipe')).toBe('Choose a released recipe');
    expect(descriptionOf('Chamber')).toBe('Choose the chamber');
    expect(descriptionOf('Lot number')).toBe('Enter the lot number');
    expect(descriptionOf('Run date')).toBe('Enter the date as YYYY-MM-DD');
    expect(api.requests).toHaveLength(0);
  });

  it('refuses a lot number over 60 characters and a lot of spaces only', async () => {
    const api = mockApi({});
    const { user, dialog } = renderDialog();

    await user.type(dialog.getByLabelText('Lot number'), '   ');
    await user.click(dialog.getByRole('button', { name: 'Start run' }));
    await waitFor(() => expect(descriptionOf('Lot number')).toBe('Enter the lot number'));

    await user.clear(dialog.getByLabelText('Lot number'));
    await user.type(dialog.getByLabelText('Lot number'), 'L'.repeat(61));
    await waitFor(() => expect(descriptionOf('Lot number')).toBe('At most 60 characters'));
    expect(api.requests).toHaveLength(0);
  });

  it('sends the chosen recipe, chamber, trimmed lot and date, and shows the operator', async () => {
    const api = mockApi({
      'POST /api/runs': { status: 201, body: testRun({ id: 41 }) },
      'GET /api/runs': { status: 200, body: [] },
    });
    const onStarted = vi.fn();
    const { user, dialog } = renderDialog(onStarted);

    expect((dialog.getByLabelText('Operator') as HTMLInputElement).value).toBe('Jonah Pell');
    await user.selectOptions(dialog.getByLabelText('Released recipe'), '15:2');
    await user.selectOptions(dialog.getByLabelText('Chamber'), 'Box coater B2');
    await user.type(dialog.getByLabelText('Lot number'), '  L-2026-119 ');
    await user.clear(dialog.getByLabelText('Run date'));
    await user.type(dialog.getByLabelText('Run date'), '2026-12-02');
    await user.click(dialog.getByRole('button', { name: 'Start run' }));

    await waitFor(() => expect(onStarted).toHaveBeenCalled());
    expect(api.calls('POST', '/api/runs').map((r) => r.body)).toEqual([
      { designId: 15, versionNumber: 2, chamberId: 3, lotNumber: 'L-2026-119', runDate: '2026-12-02' },
    ]);
    expect(onStarted.mock.calls[0]![0]).toMatchObject({ id: 41 });
  });

  it('shows the server refusal with its details and stays open', async () => {
    mockApi({
      'POST /api/runs': apiError(400, 'Bad Request', 'design 12 version 1 is not a released recipe', [
        'design 12 version 1 is not a released recipe',
      ]),
    });
    const onStarted = vi.fn();
    const { user, dialog } = renderDialog(onStarted);

    await user.selectOptions(dialog.getByLabelText('Released recipe'), '12:1');
    await user.selectOptions(dialog.getByLabelText('Chamber'), 'Box coater C1');
    await user.type(dialog.getByLabelText('Lot number'), 'L-1');
    await user.click(dialog.getByRole('button', { name: 'Start run' }));

    const alert = await dialog.findByRole('alert');
    expect(alert.textContent).toContain('The run was not started');
    expect(alert.textContent).toContain('design 12 version 1 is not a released recipe');
    expect(onStarted).not.toHaveBeenCalled();
  });
});

describe('Chamber runs page', () => {
  it('opens Start a run with the recipe of ?recipe= chosen, and lists runs with names', async () => {
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.operator } },
      'GET /api/recipes': { status: 200, body: RECIPES },
      'GET /api/chambers': { status: 200, body: CHAMBERS },
      'GET /api/runs': {
        status: 200,
        body: [
          testRun({
            durability: [{ test: 'adhesion', method: 'ISO 9211-4, tape adhesion', result: 'fail' }],
          }),
        ],
      },
    });
    const { user, router } = renderApp('/runs?recipe=15:2');

    const dialog = within(await screen.findByRole('dialog', { name: 'Start a run' }, { timeout: 10_000 }));
    expect((dialog.getByLabelText('Released recipe') as HTMLSelectElement).value).toBe('15:2');
    expect((dialog.getByLabelText('Operator') as HTMLInputElement).value).toBe(STAFF.operator.displayName);
    // The open dialog hides the page from assistive technology; Cancel also drops ?recipe=.
    await user.click(dialog.getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(router.state.location.search).toBe(''));
    await screen.findByRole('link', { name: 'L-2026-118' });
    const row = screen.getByRole('link', { name: 'L-2026-118' }).closest('[role="row"]') as HTMLElement;
    expect(screen.getByRole('link', { name: 'L-2026-118' }).getAttribute('href')).toBe('/runs/40');
    expect(within(row).getByRole('gridcell', { name: 'Lens AR trial v1' })).toBeTruthy();
    expect(within(row).getByRole('gridcell', { name: 'Box coater B2' })).toBeTruthy();
    expect(within(row).getByRole('gridcell', { name: 'Jonah Pell' })).toBeTruthy();
    expect(within(row).getByRole('gridcell', { name: 'Fail' })).toBeTruthy();
  });
});
