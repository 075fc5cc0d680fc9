import { screen, waitFor, within } from '@testing-library/react';
import { materialNmToQwot, materialQwotToNm } from '@quietglass/shared';
import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { TEST_MATERIALS } from '../../../test/design-fixtures';
import { renderWithProviders } from '../../../test/render';
import { LayerGrid } from '../components/layer-grid';
import { rowsFromLayers, type LayerRow } from '../layers';

// QWOT = 4·n(λref)·d/λref (Macleod, Thin-Film Optical Filters, 5th ed., ch. 2). For MgF2 taken as a
// constant n = 1.38 at λref = 550 nm, a quarter wave is d = 550/(4·1.38) = 99.6377 nm, so
// 99.64 nm ⇄ QWOT 1.0000.
const MGF2 = TEST_MATERIALS[2]!.model;

type User = ReturnType<typeof renderWithProviders>['user'];

function Harness({
  initial,
  onChange,
  materials = TEST_MATERIALS,
}: {
  initial: LayerRow[];
  onChange?: (rows: LayerRow[]) => void;
  materials?: typeof TEST_MATERIALS;
}) {
  const [rows, setRows] = useState(initial);
  return (
    <LayerGrid
      rows={rows}
      onRowsChange={(next) => {
        setRows(next);
        onChange?.(next);
      }}
      materials={materials}
      referenceWavelengthNm={550}
      readOnly={false}
    />
  );
}

const COLUMN = { order: 0, material: 1, thickness: 2, qwot: 3, locked: 4, notes: 5 } as const;

function dataRows(): HTMLElement[] {
  const grid = screen.getByRole('grid', { name: 'Layer grid' });
  return within(grid).getAllByRole('row').slice(1);
}

function cell(row: number, column: keyof typeof COLUMN): HTMLElement {
  return within(dataRows()[row]!).getAllByRole('gridcell')[COLUMN[column]]!;
}

function column(name: keyof typeof COLUMN): string[] {
  return dataRows().map((_, i) => cell(i, name).textContent ?? '');
}

async function editCell(user: User, row: number, name: keyof typeof COLUMN, text: string) {
  await user.dblClick(cell(row, name));
  const input = await within(cell(row, name)).findByRole('textbox');
  await user.clear(input);
  await user.type(input, `${text}{Enter}`);
}

function layers(...specs: [materialId: number, thicknessNm: number][]): LayerRow[] {
  return rowsFromLayers(
    specs.map(([materialId, thicknessNm]) => ({ materialId, thicknessNm, locked: false, notes: '' })),
  );
}

describe('LayerGrid', () => {
  it('keeps physical thickness and QWOT at the reference wavelength in step, both ways', async () => {
    let latest: LayerRow[] = [];
    const { user } = renderWithProviders(
      <Harness initial={layers([4, 50])} onChange={(r) => (latest = r)} />,
    );
    await screen.findByRole('grid', { name: 'Layer grid' });

    await editCell(user, 0, 'thickness', '99.64');
    await waitFor(() => expect(cell(0, 'qwot').textContent).toBe('1.0000'));
    // The same number from the formula and from the engine's materialNmToQwot.
    expect(((4 * 1.38 * 99.64) / 550).toFixed(4)).toBe('1.0000');
    expect(materialNmToQwot(MGF2, 99.64, 550).toFixed(4)).toBe('1.0000');

    await editCell(user, 0, 'qwot', '1');
    await waitFor(() => expect(cell(0, 'thickness').textContent).toBe('99.64'));
    // The full-precision quarter wave is kept, not the rounded figure shown.
    expect(Number(latest[0]!.thicknessNm)).toBeCloseTo(550 / (4 * 1.38), 9);
    expect(Number(latest[0]!.thicknessNm)).toBeCloseTo(materialQwotToNm(MGF2, 1, 550), 12);

    await editCell(user, 0, 'qwot', '2');
    // Half wave: d = 2·550/(4·1.38) = 199.2754 nm.
    await waitFor(() => expect(cell(0, 'thickness').textContent).toBe('199.28'));
  });

  it('chooses a layer material from the library; the thickness stays and the QWOT follows the new index', async () => {
    let latest: LayerRow[] = [];
    const { user } = renderWithProviders(
      <Harness initial={layers([4, 99.64])} onChange={(r) => (latest = r)} />,
    );
    await screen.findByRole('grid', { name: 'Layer grid' });

    await user.dblClick(cell(0, 'material'));
    await user.click(await screen.findByRole('option', { name: 'TiO2' }));

    await waitFor(() => expect(cell(0, 'material').textContent).toBe('TiO2'));
    expect(latest[0]!.materialId).toBe(5);
    expect(cell(0, 'thickness').textContent).toBe('99.64');
    // 4·2.35·99.64/550 = 1.7029 (Macleod ch. 2).
    expect(cell(0, 'qwot').textContent).toBe(((4 * 2.35 * 99.64) / 550).toFixed(4));
    expect(cell(0, 'qwot').textContent).toBe('1.7029');
  });

  it('offers no retired material, but a row that uses one keeps showing it', async () => {
    const retired = TEST_MATERIALS.map((m) =>
      m.id === 5 ? { ...m, retiredAt: '2026-12-01T00:00:00.000Z' } : m,
    );
    const { user } = renderWithProviders(
      <Harness initial={layers([4, 99.64], [2, 80])} materials={retired} />,
    );
    await screen.findByRole('grid', { name: 'Layer grid' });
    await user.dblClick(cell(0, 'material'));
    const options = (await screen.findAllByRole('option')).map((o) => o.textContent);
    expect(options).toContain('MgF2');
    expect(options).not.toContain('TiO2');
    await user.keyboard('{Escape}');

    const { unmount } = renderWithProviders(<Harness initial={layers([5, 50])} materials={retired} />);
    await waitFor(() => expect(screen.getAllByRole('grid', { name: 'Layer grid' })).toHaveLength(2));
    const second = within(screen.getAllByRole('grid', { name: 'Layer grid' })[1]!);
    expect(second.getAllByRole('row')[1]!.textContent).toContain('TiO2');
    unmount();
  });

  it('shows an inline error for a negative or non-numeric thickness and no QWOT for it', async () => {
    let latest: LayerRow[] = [];
    const { user } = renderWithProviders(
      <Harness initial={layers([4, 50], [5, 60])} onChange={(r) => (latest = r)} />,
    );
    await screen.findByRole('grid', { name: 'Layer grid' });

    await editCell(user, 1, 'thickness', '-5');
    await waitFor(() =>
      expect(cell(1, 'thickness').textContent).toBe('-5Thickness must be greater than 0 nm'),
    );
    expect(cell(1, 'qwot').textContent).toBe('—');
    expect(latest[1]!.thicknessNm).toBe('-5');

    await editCell(user, 0, 'thickness', '12..5');
    await waitFor(() =>
      expect(cell(0, 'thickness').textContent).toBe('12..5Enter the thickness in nm as a number'),
    );
  });

  it('pastes tab-separated rows after the selected layer', async () => {
    const { user } = renderWithProviders(<Harness initial={layers([5, 60])} />);
    await screen.findByRole('grid', { name: 'Layer grid' });
    await user.click(cell(0, 'order'));

    await user.click(screen.getByRole('button', { name: 'Paste rows…' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Paste rows' }));
    await user.click(dialog.getByLabelText('Rows from a spreadsheet'));
    await user.paste('Material\tThickness\tNotes\nMgF2\t99.64\touter layer\r\ntio2\t58.51\n');
    await user.click(dialog.getByRole('button', { name: 'Add rows' }));

    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'Paste rows' })).toBeNull());
    expect(column('material')).toEqual(['TiO2', 'MgF2', 'TiO2']);
    expect(column('thickness')).toEqual(['60.00', '99.64', '58.51']);
    expect(column('notes')).toEqual(['', 'outer layer', '']);
  });

  it('pastes nothing when any row is bad and lists every bad row', async () => {
    const { user } = renderWithProviders(<Harness initial={layers([5, 60])} />);
    await screen.findByRole('grid', { name: 'Layer grid' });

    await user.click(screen.getByRole('button', { name: 'Paste rows…' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Paste rows' }));
    await user.click(dialog.getByLabelText('Rows from a spreadsheet'));
    await user.paste('MgF2\t99.64\nMgF3\t100\nTiO2\tabc\nMgF2\t-3\nTiO2 58');
    await user.click(dialog.getByRole('button', { name: 'Add rows' }));

    const problems = within(await dialog.findByRole('list', { name: 'Paste problems' }));
    expect(problems.getAllByRole('listitem').map((li) => li.textContent)).toEqual([
      'Row 2: unknown material "MgF3"',
      'Row 3: Enter the thickness in nm as a number',
      'Row 4: Thickness must be greater than 0 nm',
      'Row 5: expected a material name and a thickness separated by a tab, comma or semicolon',
    ]);
    expect(dialog.getByRole('alert').textContent).toContain('Nothing was added');
    await user.click(dialog.getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'Paste rows' })).toBeNull());
    expect(column('material')).toEqual(['TiO2']);
  });

  it('moves the selected layer up and down, and does not move it past either end', async () => {
    const { user } = renderWithProviders(<Harness initial={layers([4, 90], [5, 60], [1, 30])} />);
    await screen.findByRole('grid', { name: 'Layer grid' });
    expect(column('material')).toEqual(['MgF2', 'TiO2', 'Air']);

    await user.click(cell(2, 'order'));
    await user.click(screen.getByRole('button', { name: 'Move up' }));
    expect(column('material')).toEqual(['MgF2', 'Air', 'TiO2']);
    await user.click(screen.getByRole('button', { name: 'Move up' }));
    expect(column('material')).toEqual(['Air', 'MgF2', 'TiO2']);
    expect(column('order')).toEqual(['1', '2', '3']);
    expect((screen.getByRole('button', { name: 'Move up' }) as HTMLButtonElement).disabled).toBe(true);

    await user.click(screen.getByRole('button', { name: 'Move down' }));
    expect(column('material')).toEqual(['MgF2', 'Air', 'TiO2']);
    expect(column('thickness')).toEqual(['90.00', '30.00', '60.00']);
  });

  it('adds, duplicates and deletes layers from the toolbar', async () => {
    const { user } = renderWithProviders(<Harness initial={layers([4, 90])} />);
    await screen.findByRole('grid', { name: 'Layer grid' });

    await user.click(cell(0, 'order'));
    await user.click(screen.getByRole('button', { name: 'Duplicate' }));
    expect(column('thickness')).toEqual(['90.00', '90.00']);
    await user.click(screen.getByRole('button', { name: 'Add layer' }));
    // A new layer takes the selected layer's material and waits for a thickness.
    expect(column('material')).toEqual(['MgF2', 'MgF2', 'MgF2']);
    expect(column('thickness')[2]).toBe('—Enter the thickness in nm as a number');
    await user.click(screen.getByRole('button', { name: 'Delete' }));
    expect(column('thickness')).toEqual(['90.00', '90.00']);
  });
});
