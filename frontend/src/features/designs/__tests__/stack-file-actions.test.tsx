import { screen, waitFor, within } from '@testing-library/react';
import { parseStack, responseAt, type StackDescription } from '@quietglass/shared';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { TEST_DESIGN, TEST_MATERIALS, testVersion } from '../../../test/design-fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { DesignWorkspace } from '../components/design-workspace';
import { createInlinePreviewComputer } from '../../../lib/preview/preview-computer';
import { PreviewComputerProvider } from '../../../lib/preview/preview-context';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Answers: GET /designs/:id/versions/:n; POST /designs/:id/versions {fromNumber, content?, sourceFile?}.
const QUARTER_MGF2 = 550 / (4 * 1.38);

function renderWorkspace(onVersionChange: (n: number) => void = () => {}) {
  return renderWithProviders(
    <PreviewComputerProvider computer={createInlinePreviewComputer()}>
      <DesignWorkspace
        design={TEST_DESIGN}
        versionNumber={1}
        onVersionChange={onVersionChange}
        library={TEST_MATERIALS}
        maskBands={null}
        maskName={null}
        canEdit
      />
    </PreviewComputerProvider>,
  );
}

afterEach(() => vi.restoreAllMocks());

describe('stack files in the design workspace', () => {
  it('exports the version as a stack file that computes the quarter-wave reflectance', async () => {
    mockApi({
      'GET /api/designs/12/history': { status: 200, body: [] },
      'GET /api/designs/12/versions/1': {
        status: 200,
        body: testVersion({
          layers: [{ materialId: 4, thicknessNm: QUARTER_MGF2, locked: false, notes: '' }],
        }),
      },
    });
    const blobs: Blob[] = [];
    vi.spyOn(URL, 'createObjectURL').mockImplementation((b) => {
      blobs.push(b as Blob);
      return 'blob:stack';
    });
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {});
    const names: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      names.push(this.download);
    });
    const { user } = renderWorkspace();
    const button = await screen.findByRole('button', { name: 'Export stack file' });
    await waitFor(() => expect((button as HTMLButtonElement).disabled).toBe(false));
    await user.click(button);
    expect(names).toEqual(['Lens-AR-trial-v1.stack.json']);
    const file = JSON.parse(await blobs[0]!.text()) as StackDescription;
    expect(file.layers).toEqual([{ material: 'MgF2', thickness_nm: QUARTER_MGF2 }]);
    expect(file.substrate).toEqual({ material: 'Test glass', thickness_mm: 2 });
    // Quarter wave on glass: R = ((n0·ns − n1²)/(n0·ns + n1²))² (Macleod, Thin-Film Optical Filters, §3.2.1).
    const R = responseAt(parseStack(file), 550, 0, 'avg').R;
    expect(R).toBeCloseTo(((1.52 - 1.38 ** 2) / (1.52 + 1.38 ** 2)) ** 2, 12);
  });

  it('imports a stack file as a new draft, and lists the problems of a bad one without sending it', async () => {
    const calls = mockApi({
      'GET /api/designs/12/history': { status: 200, body: [] },
      'GET /api/designs/12/versions/1': { status: 200, body: testVersion({ status: 'submitted' }) },
      'POST /api/designs/12/versions': { status: 201, body: testVersion({ number: 2 }) },
    });
    const changed: number[] = [];
    const { user } = renderWorkspace((n) => changed.push(n));
    const input = await screen.findByLabelText('Stack file to import');

    const bad = { substrate: { material: 'Unobtainium' }, layers: [{ n: 2, thickness_nm: 10 }] };
    await user.upload(input, new File([JSON.stringify(bad)], 'bad.json', { type: 'application/json' }));
    const problemsAlert = async () =>
      (await screen.findByText('Nothing was imported')).closest('[role="alert"]') as HTMLElement;
    const alert = await problemsAlert();
    expect(
      within(alert)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual([
      'substrate: material "Unobtainium" is not in the library (match a library name, or add it first)',
      'layers[0]: give a material by name; an index or model written inline has no library material',
    ]);
    await user.upload(input, new File(['{ not json'], 'broken.json'));
    await waitFor(async () =>
      expect((await problemsAlert()).textContent).toMatch(/broken\.json has 1 problem:not JSON/),
    );
    expect(calls.calls('POST', '/api/designs/12/versions')).toEqual([]);

    const good = {
      reference_nm: 600,
      substrate: { material: 'test glass', thickness_mm: 3 },
      layers: [
        { material: 'MgF2', qwot: 1, label: 'outer' },
        { material: 'TiO2', thickness_nm: 20 },
      ],
    };
    await user.upload(input, new File([JSON.stringify(good)], 'trial.stack.json'));
    await waitFor(() => expect(changed).toEqual([2]));
    expect(calls.calls('POST', '/api/designs/12/versions').map((c) => c.body)).toEqual([
      {
        fromNumber: 1,
        sourceFile: 'trial.stack.json',
        content: {
          incidentMaterialId: 1,
          substrateMaterialId: 2,
          substrateThicknessMm: 3,
          backSurface: 'front-only',
          referenceWavelengthNm: 600,
          notes: '',
          layers: [
            { materialId: 4, thicknessNm: 600 / (4 * 1.38), locked: false, notes: 'outer' },
            { materialId: 5, thicknessNm: 20, locked: false, notes: '' },
          ],
        },
      },
    ]);
  });
});
