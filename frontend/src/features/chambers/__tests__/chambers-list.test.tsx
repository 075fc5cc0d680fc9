import { screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../test/render';
import { ChambersList } from '../components/chambers-list';

// Invented chamber; values as GET /chambers returns them (backend/test/chambers.e2e-spec.ts).
const CHAMBER = {
  id: 7,
  name: 'Bell jar 1',
  monitorWavelengthsNm: [550, 632.8],
  monitorChipMaterialId: 2,
  materials: [
    { materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 },
    { materialId: 5, toolingFactor: 0.95, rateNmPerS: 0.3 },
  ],
  notes: '',
  version: 1,
  updatedAt: '2026-12-01T08:00:00.000Z',
};
const MATERIALS = [
  { id: 2, name: 'Fused silica' },
  { id: 4, name: 'MgF2' },
  { id: 5, name: 'TiO2' },
];

describe('ChambersList', () => {
  it('shows tooling factors and rates by material name, read-only without an edit handler', () => {
    renderWithProviders(<ChambersList chambers={[CHAMBER]} materials={MATERIALS} />);
    const table = screen.getByRole('table', { name: 'Tooling factors and rates of Bell jar 1' });
    const rows = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) =>
        within(r)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      );
    expect(rows).toEqual([
      ['MgF2', '1.080', '0.80'],
      ['TiO2', '0.950', '0.30'],
    ]);
    expect(screen.getByText(/Monitor at 550, 632.8 nm through a Fused silica chip/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Edit Bell jar 1' })).toBeNull();
  });

  it('offers Edit to those who may change chambers', async () => {
    const onEdit = vi.fn();
    const { user } = renderWithProviders(
      <ChambersList chambers={[CHAMBER]} materials={MATERIALS} onEdit={onEdit} />,
    );
    await user.click(await screen.findByRole('button', { name: 'Edit Bell jar 1' }));
    expect(onEdit).toHaveBeenCalledWith(CHAMBER);
  });
});
