import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import type { ChamberView } from '../api/get-chambers';
import {
  chamberFormSchema,
  valuesOfChamber,
  type ChamberFormValues,
  type MaterialRowValues,
} from '../chamber-form';
import { ChamberFormDialog } from '../components/chamber-form-dialog';

// The form checks the API's own chamber schema (shared/src/schemas/chambers.ts): tooling factor and
// rate > 0 (at most 10 and 100 nm/s), 1–8 monitor wavelengths within 200–3000 nm. Invented chamber.

const MATERIALS = [
  { id: 2, name: 'Fused silica' },
  { id: 4, name: 'MgF2' },
  { id: 6, name: 'SiO2' },
];

const CHAMBER: ChamberView = {
  id: 7,
  name: 'Bell jar 1',
  monitorWavelengthsNm: [550, 632.8],
  monitorChipMaterialId: 2,
  materials: [{ materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 }],
  notes: 'Demo chamber',
  version: 3,
  updatedAt: '2026-12-01T08:00:00.000Z',
};

function renderDialog(chamber: ChamberView | null, onClose = vi.fn()) {
  const view = renderWithProviders(
    <ChamberFormDialog open chamber={chamber} materials={MATERIALS} onClose={onClose} />,
  );
  return { ...view, onClose, dialog: within(screen.getByRole('dialog')) };
}

/** The messages the form shows for its values: the shared chamber schema's, after parsing the text. */
function problems(patch: Partial<ChamberFormValues>, row: Partial<MaterialRowValues> = {}): string[] {
  const values: ChamberFormValues = {
    name: 'Bell jar 2',
    monitorWavelengths: '550',
    monitorChipMaterialId: '2',
    materials: [{ materialId: '4', toolingFactor: '1.08', rateNmPerS: '0.8', ...row }],
    notes: '',
    ...patch,
  };
  const parsed = chamberFormSchema.safeParse(values);
  return parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
}

describe('chamber form schema', () => {
  it.each([
    ['0', 'Tooling factor must be greater than 0'],
    ['-1.2', 'Tooling factor must be greater than 0'],
    ['10.5', 'Tooling factor must be at most 10'],
    ['fast', 'Enter the tooling factor as a number, e.g. 1.04'],
    ['', 'Enter the tooling factor as a number, e.g. 1.04'],
  ])('rejects tooling factor %j: %s', (text, message) => {
    expect(problems({}, { toolingFactor: text })).toEqual([`materials.0.toolingFactor: ${message}`]);
  });

  it('accepts a tooling factor above and below 1 and hands on the parsed request body', () => {
    expect(problems({}, { toolingFactor: '0.95' })).toEqual([]);
    const edited = { ...valuesOfChamber(CHAMBER), monitorWavelengths: '550; 632.8' };
    edited.materials = [{ materialId: '4', toolingFactor: '1.08', rateNmPerS: ' 0.8 ' }];
    expect(chamberFormSchema.parse(edited)).toEqual({
      name: 'Bell jar 1',
      monitorWavelengthsNm: [550, 632.8],
      monitorChipMaterialId: 2,
      materials: [{ materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 }],
      notes: 'Demo chamber',
    });
  });

  it.each([
    ['', 'Enter at least one monitor wavelength'],
    ['550, abc', 'Enter wavelengths in nm as numbers separated by commas, e.g. 550, 632.8'],
    ['150', 'Monitor wavelengths must be between 200 and 3000 nm'],
    ['400 450 500 550 600 650 700 750 800', 'At most 8 monitor wavelengths'],
  ])('rejects monitor wavelengths %j: %s', (text, message) => {
    expect(problems({ monitorWavelengths: text }).map((p) => p.replace(/^[\w.]+: /, ''))).toEqual([message]);
  });
});

describe('ChamberFormDialog', () => {
  it('rejects a tooling factor of 0 and a negative rate with clear messages and sends nothing', async () => {
    const api = mockApi({});
    const { user, dialog } = renderDialog(null);
    await user.type(dialog.getByLabelText('Name'), 'Bell jar 2');
    await user.type(dialog.getByLabelText('Monitor wavelengths (nm)'), '550');
    await user.selectOptions(dialog.getByLabelText('Monitor chip material'), 'Fused silica');
    const row = within(dialog.getByRole('group', { name: 'Material row 1' }));
    await user.selectOptions(row.getByLabelText('Material'), 'MgF2');
    await user.clear(row.getByLabelText('Tooling factor'));
    await user.type(row.getByLabelText('Tooling factor'), '0');
    await user.type(row.getByLabelText('Rate (nm/s)'), '-0.5');
    await user.click(dialog.getByRole('button', { name: 'Save chamber' }));

    expect(await row.findByText('Tooling factor must be greater than 0')).toBeTruthy();
    expect(row.getByText('Rate must be greater than 0 nm/s')).toBeTruthy();
    expect(row.getByLabelText('Tooling factor').getAttribute('aria-invalid')).toBe('true');
    expect(api.requests).toHaveLength(0);
  });

  it('refuses the same material twice', async () => {
    const api = mockApi({});
    const { user, dialog } = renderDialog(CHAMBER);
    await user.click(dialog.getByRole('button', { name: 'Add material' }));
    const second = within(dialog.getByRole('group', { name: 'Material row 2' }));
    await user.selectOptions(second.getByLabelText('Material'), 'MgF2');
    await user.type(second.getByLabelText('Rate (nm/s)'), '1');
    await user.click(dialog.getByRole('button', { name: 'Save chamber' }));
    expect(await second.findByText('This material is already listed in row 1')).toBeTruthy();
    expect(api.requests).toHaveLength(0);
  });

  it('creates a chamber with numbers parsed from the fields', async () => {
    const api = mockApi({
      'POST /api/chambers': (request) => ({
        status: 201,
        body: { ...CHAMBER, ...(request.body as object), id: 8, version: 1 },
      }),
      'GET /api/chambers': { status: 200, body: [] },
    });
    const { user, dialog, onClose } = renderDialog(null);
    await user.type(dialog.getByLabelText('Name'), '  Bell jar 2 ');
    await user.type(dialog.getByLabelText('Monitor wavelengths (nm)'), '550; 632.8');
    await user.selectOptions(dialog.getByLabelText('Monitor chip material'), 'Fused silica');
    const row = within(dialog.getByRole('group', { name: 'Material row 1' }));
    await user.selectOptions(row.getByLabelText('Material'), 'SiO2');
    await user.clear(row.getByLabelText('Tooling factor'));
    await user.type(row.getByLabelText('Tooling factor'), '1.04');
    await user.type(row.getByLabelText('Rate (nm/s)'), '0.8');
    await user.click(dialog.getByRole('button', { name: 'Save chamber' }));

    await waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(api.calls('POST', '/api/chambers').map((r) => r.body)).toEqual([
      {
        name: 'Bell jar 2',
        monitorWavelengthsNm: [550, 632.8],
        monitorChipMaterialId: 2,
        materials: [{ materialId: 6, toolingFactor: 1.04, rateNmPerS: 0.8 }],
        notes: '',
      },
    ]);
  });

  it("edits with the chamber's version and shows the API's refusal", async () => {
    const api = mockApi({
      'PUT /api/chambers/7': apiError(
        400,
        'Bad Request',
        'materials.0.toolingFactor: Tooling factor must be greater than 0',
        ['materials.0.toolingFactor: Tooling factor must be greater than 0'],
      ),
    });
    const { user, dialog, onClose } = renderDialog(CHAMBER);
    expect((dialog.getByLabelText('Monitor wavelengths (nm)') as HTMLInputElement).value).toBe('550, 632.8');
    await user.click(dialog.getByRole('button', { name: 'Save chamber' }));
    expect((await dialog.findByRole('alert')).textContent).toContain(
      'materials.0.toolingFactor: Tooling factor must be greater than 0',
    );
    expect(api.calls('PUT', '/api/chambers/7').map((r) => r.body)).toEqual([
      {
        name: 'Bell jar 1',
        monitorWavelengthsNm: [550, 632.8],
        monitorChipMaterialId: 2,
        materials: [{ materialId: 4, toolingFactor: 1.08, rateNmPerS: 0.8 }],
        notes: 'Demo chamber',
        version: 3,
      },
    ]);
    expect(onClose).not.toHaveBeenCalled();
  });
});
