import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { RecipesGrid } from '../components/recipes-grid';

// Answers: GET /recipes as in backend/test/approvals.e2e-spec.ts (released versions only). Invented data.
describe('RecipesGrid', () => {
  it('lists released recipes with customer, version and who released them, each opening its run sheet', async () => {
    mockApi({
      'GET /api/recipes': {
        status: 200,
        body: [
          {
            designId: 30,
            number: 2,
            name: 'Window 532 AR',
            customer: 'Orrin Medical Imaging',
            releasedAt: '2026-12-01T10:00:00.000Z',
            releasedBy: 'Tomas Reyes',
          },
        ],
      },
    });
    renderWithProviders(<RecipesGrid />);
    const link = await screen.findByRole('link', { name: 'Window 532 AR' });
    expect(link.getAttribute('href')).toBe('/recipes/30/2');
    const row = link.closest('[role="row"]') as HTMLElement;
    const cells = within(row)
      .getAllByRole('gridcell')
      .map((c) => c.textContent);
    expect(cells.slice(1, 3)).toEqual(['2', 'Orrin Medical Imaging']);
    expect(cells[4]).toBe('Tomas Reyes');
    expect(
      within(row).getByRole('link', { name: 'Run sheet of Window 532 AR version 2' }).getAttribute('href'),
    ).toBe('/recipes/30/2');
  });
});
