import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { TEST_DESIGN } from '../../../test/design-fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { DesignDetailsDialog } from '../components/design-details-dialog';

// Answers: PATCH /designs/:id (UpdateDesignDto: name 1–160 characters, specMaskId of the design's
// customer or null; 400 naming the mask otherwise).

const MASKS = [
  { id: 6, name: 'Fenwick lens AR', revision: 'A', kind: 'customer' as const },
  { id: 9, name: 'Fenwick lens AR', revision: 'B', kind: 'customer' as const },
];

function renderDialog(onClose = vi.fn()) {
  const view = renderWithProviders(
    <DesignDetailsDialog open design={TEST_DESIGN} specMasks={MASKS} onClose={onClose} />,
  );
  return { ...view, onClose };
}

describe('DesignDetailsDialog', () => {
  it('renames the design and moves it to the new mask revision', async () => {
    const api = mockApi({
      'PATCH /api/designs/12': {
        status: 200,
        body: { ...TEST_DESIGN, name: 'Lens AR rev B', specMaskId: 9 },
      },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user, onClose } = renderDialog();
    const dialog = within(await screen.findByRole('dialog', { name: 'Design details' }));
    expect((dialog.getByLabelText('Name') as HTMLInputElement).value).toBe('Lens AR trial');
    expect((dialog.getByLabelText('Spec mask') as HTMLSelectElement).value).toBe('6');

    await user.clear(dialog.getByLabelText('Name'));
    await user.type(dialog.getByLabelText('Name'), '  Lens AR rev B ');
    await user.selectOptions(dialog.getByLabelText('Spec mask'), '9');
    await user.click(dialog.getByRole('button', { name: 'Save details' }));

    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('PATCH', '/api/designs/12').map((r) => r.body)).toEqual([
      { version: 1, name: 'Lens AR rev B', specMaskId: 9 },
    ]);
  });

  it('refuses an empty name without asking the API and shows the API refusal', async () => {
    const api = mockApi({
      'PATCH /api/designs/12': apiError(400, 'Bad Request', 'Invalid input: specMaskId: spec mask 6 …', [
        'specMaskId: spec mask 6 belongs to another customer',
      ]),
    });
    const { user } = renderDialog();
    const dialog = within(await screen.findByRole('dialog', { name: 'Design details' }));
    await user.clear(dialog.getByLabelText('Name'));
    await user.click(dialog.getByRole('button', { name: 'Save details' }));
    expect(dialog.getByText('Enter a name')).toBeTruthy();
    expect(api.requests).toHaveLength(0);

    await user.type(dialog.getByLabelText('Name'), 'Lens AR');
    await user.selectOptions(dialog.getByLabelText('Spec mask'), '');
    await user.click(dialog.getByRole('button', { name: 'Save details' }));
    expect((await dialog.findByRole('alert')).textContent).toContain(
      'specMaskId: spec mask 6 belongs to another customer',
    );
    expect(api.calls('PATCH', '/api/designs/12').map((r) => r.body)).toEqual([
      { version: 1, name: 'Lens AR', specMaskId: null },
    ]);
  });
});
