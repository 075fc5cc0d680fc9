import { act, screen, waitFor, within } from '@testing-library/react';
import type { LimitBand } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { TEST_DESIGN, TEST_MATERIALS, testVersion } from '../../../test/design-fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderApp, renderWithProviders } from '../../../test/render';
import { DesignWorkspace } from '../components/design-workspace';
import type { PreviewRequest } from '../../../lib/preview/compute-preview';
import { createInlinePreviewComputer } from '../../../lib/preview/preview-computer';
import { PreviewComputerProvider } from '../../../lib/preview/preview-context';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Answers: the Stack designs endpoints of the design-workspace API contract (GET/PUT
// /designs/:id/versions/:n with rowVersion; 409 on a stale rowVersion; POST /designs/:id/versions).

const VERSION_URL = '/api/designs/12/versions/1';
const STALE_MESSAGE =
  'Version 1 was saved by someone else since you opened it; reload to see their changes (nothing of yours was saved)';

// Quarter-wave MgF2 (n 1.38) on n 1.52 from air reflects 1.26 % at 550 nm (Macleod ch. 2), inside
// R ≤ 1.5 %; a 10 nm layer leaves R near the bare glass's 4.26 % (Hecht ch. 4), outside it.
const MASK: LimitBand[] = [
  {
    from_nm: 545,
    to_nm: 555,
    angles_deg: [0],
    polarisation: 'avg',
    quantity: 'R',
    max_percent: 1.5,
    step_nm: 1,
  },
];

type User = ReturnType<typeof renderWithProviders>['user'];

/** The signed-in reviewer: an engineer who neither wrote nor submitted the test version. */
const REVIEWER = {
  id: 9,
  email: 'reviewer@example.test',
  displayName: 'Ines Review',
  role: 'engineer' as const,
  active: true,
  mustChangePassword: false,
  createdAt: '2026-11-01T08:00:00.000Z',
  version: 1,
};

/** The workspace's answers plus an empty audit trail (the page's approval panel reads it). */
function mockWorkspaceApi(handlers: Parameters<typeof mockApi>[0]) {
  return mockApi({ 'GET /api/designs/12/history': { status: 200, body: [] }, ...handlers });
}

function layer(materialId: number, thicknessNm: number) {
  return { materialId, thicknessNm, locked: false, notes: '' };
}

function renderWorkspace(
  options: { status?: 'draft' | 'submitted'; onVersionChange?: (n: number) => void } = {},
) {
  const requests: PreviewRequest[] = [];
  const inline = createInlinePreviewComputer();
  const computer = {
    compute: (request: PreviewRequest) => {
      requests.push(request);
      return inline.compute(request);
    },
    dispose: () => {},
  };
  const view = renderWithProviders(
    <PreviewComputerProvider computer={computer}>
      <DesignWorkspace
        design={TEST_DESIGN}
        versionNumber={1}
        onVersionChange={options.onVersionChange ?? (() => {})}
        library={TEST_MATERIALS}
        maskBands={MASK}
        maskName="Fenwick lens AR rev A"
        canEdit
      />
    </PreviewComputerProvider>,
  );
  return { ...view, requests };
}

function gridCell(row: number, col: number): HTMLElement {
  const grid = screen.getByRole('grid', { name: 'Layer grid' });
  return within(within(grid).getAllByRole('row')[row + 1]!).getAllByRole('gridcell')[col]!;
}

async function setThickness(user: User, row: number, text: string) {
  await user.dblClick(gridCell(row, 2));
  const input = await within(gridCell(row, 2)).findByRole('textbox');
  await user.clear(input);
  await user.type(input, `${text}{Enter}`);
}

function saveButton(): HTMLButtonElement {
  return screen.getByRole('button', { name: 'Save' }) as HTMLButtonElement;
}

describe('DesignWorkspace', () => {
  it('shows Fail, then Pass once the thickness reaches a quarter wave', async () => {
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 10)] }) },
    });
    const { user, requests } = renderWorkspace();

    const badge = await screen.findByRole('status', { name: 'Spec mask result' });
    await waitFor(() => expect(within(badge).getByText('Fail')).toBeTruthy(), { timeout: 5000 });
    expect(badge.textContent).toContain('Fenwick lens AR rev A');

    await setThickness(user, 0, '99.64');
    await waitFor(() => expect(within(badge).getByText('Pass')).toBeTruthy(), { timeout: 5000 });
    expect(within(badge).queryByText('Fail')).toBeNull();
    // 1.5 − R(545 nm) is the worst margin, R rising away from the 550 nm minimum.
    expect(badge.textContent).toMatch(/Worst margin \+0\.\d{3} percentage points at (545|555) nm, 0°/);
    // What went to the worker: the design's stack, its mask and the front surface alone.
    const last = requests[requests.length - 1]!;
    expect(last.maskBands).toEqual(MASK);
    expect(last.back).toBe('none');
    expect(last.stack.layers).toEqual([{ material: 'material-4', thickness_nm: 99.64, label: '1 MgF2' }]);
    // Rv and a swatch of the reflected colour are shown beside the badge.
    expect(screen.getByRole('group', { name: 'Reflected colour' }).textContent).toMatch(/^Rv \d+\.\d\d %/);
  });

  it('starts the preview on the range of the mask and remembers the range set for the design', async () => {
    window.localStorage.clear();
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 99.64)] }) },
    });
    const first = renderWorkspace();
    // 545–555 nm with the 20 nm least margin, rounded outward to 10 nm (plotRangeForMask).
    await waitFor(() => expect(first.requests.at(-1)?.wavelengths).toMatchObject({ fromNm: 520, toNm: 580 }));
    const preview = () => within(screen.getByRole('region', { name: 'Instant preview' }));
    const from = preview().getByLabelText('From (nm)') as HTMLInputElement;
    expect(from.value).toBe('520');
    expect((preview().getByLabelText('Angles (°)') as HTMLInputElement).value).toBe('0');

    await first.user.clear(from);
    await first.user.type(from, '450');
    await waitFor(() => expect(first.requests.at(-1)?.wavelengths).toMatchObject({ fromNm: 450, toNm: 580 }));
    first.unmount();

    const second = renderWorkspace();
    await waitFor(() =>
      expect(second.requests.at(-1)?.wavelengths).toMatchObject({ fromNm: 450, toNm: 580 }),
    );
    expect((preview().getByLabelText('From (nm)') as HTMLInputElement).value).toBe('450');
    await second.user.click(screen.getByRole('button', { name: 'Range of the mask' }));
    await waitFor(() =>
      expect(second.requests.at(-1)?.wavelengths).toMatchObject({ fromNm: 520, toNm: 580 }),
    );
    window.localStorage.clear();
  });

  it('undoes and redoes grid edits with the buttons and Ctrl+Z / Ctrl+Shift+Z', async () => {
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 90)] }) },
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });
    await setThickness(user, 0, '99.64');
    await waitFor(() => expect(gridCell(0, 2).textContent).toBe('99.64'));
    await setThickness(user, 0, '101');
    await waitFor(() => expect(gridCell(0, 2).textContent).toBe('101.00'));

    await user.click(screen.getByRole('button', { name: 'Undo' }));
    expect(gridCell(0, 2).textContent).toBe('99.64');
    (document.activeElement as HTMLElement | null)?.blur();
    await user.keyboard('{Control>}z{/Control}');
    expect(gridCell(0, 2).textContent).toBe('90.00');
    expect(saveButton().disabled).toBe(true);
    await user.keyboard('{Control>}{Shift>}z{/Shift}{/Control}');
    expect(gridCell(0, 2).textContent).toBe('99.64');
    await user.click(screen.getByRole('button', { name: 'Redo' }));
    expect(gridCell(0, 2).textContent).toBe('101.00');
  });

  it('marks a negative thickness in the grid and disables Save with the reason', async () => {
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: {
        status: 200,
        body: testVersion({ layers: [layer(4, 99.64), layer(5, 58.51)] }),
      },
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });
    expect(saveButton().disabled).toBe(true);
    expect(screen.getByText('No unsaved changes')).toBeTruthy();

    await setThickness(user, 1, '-20');

    await waitFor(() => expect(gridCell(1, 2).textContent).toBe('-20Thickness must be greater than 0 nm'));
    expect(saveButton().disabled).toBe(true);
    const reasonId = saveButton().getAttribute('aria-describedby') ?? '';
    expect(document.getElementById(reasonId)?.textContent).toBe(
      'Cannot save: Layer 2: Thickness must be greater than 0 nm',
    );

    await setThickness(user, 1, '20');
    await waitFor(() => expect(saveButton().disabled).toBe(false));
  });

  it('on a stale save shows the server message and replaces the grid only after the user confirms Reload', async () => {
    const theirs = testVersion({ rowVersion: 2, layers: [layer(5, 58.51), layer(4, 99.64)] });
    const api = mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: [
        { status: 200, body: testVersion({ layers: [layer(4, 90)] }) },
        { status: 200, body: theirs },
      ],
      [`PUT ${VERSION_URL}`]: apiError(409, 'Conflict', STALE_MESSAGE),
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });

    await setThickness(user, 0, '99.64');
    await waitFor(() => expect(saveButton().disabled).toBe(false));
    await user.click(saveButton());

    const alert = await screen.findByText(STALE_MESSAGE);
    expect(api.calls('PUT', VERSION_URL).map((r) => r.body)).toEqual([
      {
        incidentMaterialId: 1,
        substrateMaterialId: 2,
        substrateThicknessMm: 2,
        backSurface: 'front-only',
        referenceWavelengthNm: 550,
        notes: '',
        layers: [layer(4, 99.64)],
        rowVersion: 1,
      },
    ]);

    // Reload asks first; keeping the edits changes nothing.
    await user.click(
      within(alert.closest('[role="alert"]') as HTMLElement).getByRole('button', { name: 'Reload' }),
    );
    const ask = within(
      await screen.findByRole('dialog', { name: 'Replace your grid with the saved version?' }),
    );
    await user.click(ask.getByRole('button', { name: 'Keep my changes' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(gridCell(0, 2).textContent).toBe('99.64');
    expect(api.calls('GET', VERSION_URL)).toHaveLength(1);

    await user.click(screen.getByRole('button', { name: 'Reload' }));
    const again = within(
      await screen.findByRole('dialog', { name: 'Replace your grid with the saved version?' }),
    );
    await user.click(again.getByRole('button', { name: 'Replace with saved version' }));

    await waitFor(() => expect(gridCell(0, 1).textContent).toBe('TiO2'));
    expect(gridCell(0, 2).textContent).toBe('58.51');
    expect(gridCell(1, 2).textContent).toBe('99.64');
    expect(api.calls('GET', VERSION_URL)).toHaveLength(2);
    expect(screen.queryByText(STALE_MESSAGE)).toBeNull();
  });

  it('saves a draft with its rowVersion and then has nothing unsaved', async () => {
    const api = mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 90)] }) },
      [`PUT ${VERSION_URL}`]: (request) => ({
        status: 200,
        body: { ...testVersion(), ...(request.body as object), rowVersion: 2 },
      }),
      'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });

    await setThickness(user, 0, '99.64');
    await user.click(saveButton());

    await waitFor(() => expect(screen.getByText('No unsaved changes')).toBeTruthy());
    expect((api.calls('PUT', VERSION_URL)[0]!.body as { rowVersion: number }).rowVersion).toBe(1);
  });

  it('exports a stack file only of the saved version, never of unsaved grid edits', async () => {
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 90)] }) },
      [`PUT ${VERSION_URL}`]: (request) => ({
        status: 200,
        body: { ...testVersion(), ...(request.body as object), rowVersion: 2 },
      }),
      'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });
    const exportButton = () => screen.getByRole('button', { name: 'Export stack file' }) as HTMLButtonElement;
    await waitFor(() => expect(exportButton().disabled).toBe(false));

    await setThickness(user, 0, '99.64');
    expect(exportButton().disabled).toBe(true);
    expect(exportButton().title).toBe('Save your changes first: the file is exported as version 1 as saved');

    await user.click(saveButton());
    await waitFor(() => expect(exportButton().disabled).toBe(false));
  });

  it('asks before leaving the page with unsaved grid edits, and stays or leaves as chosen', async () => {
    mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: testVersion({ layers: [layer(4, 90)] }) },
    });
    const { user, router } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });
    await setThickness(user, 0, '99.64');
    expect(screen.getByText('Unsaved changes')).toBeTruthy();

    await act(() => router.navigate('/materials'));
    const dialog = within(await screen.findByRole('dialog', { name: 'Leave with unsaved changes?' }));
    await user.click(dialog.getByRole('button', { name: 'Stay here' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(router.state.location.pathname).toBe('/');
    expect(gridCell(0, 2).textContent).toBe('99.64');

    await act(() => router.navigate('/materials'));
    const again = within(await screen.findByRole('dialog', { name: 'Leave with unsaved changes?' }));
    await user.click(again.getByRole('button', { name: 'Discard and leave' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/materials'));
  });

  it('submits a saved draft for approval after confirming, and then shows it read-only', async () => {
    const api = mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: {
        status: 200,
        body: testVersion({ rowVersion: 3, layers: [layer(4, 99.64)] }),
      },
      [`POST ${VERSION_URL}/submit`]: {
        status: 201,
        body: testVersion({ status: 'submitted', rowVersion: 4, layers: [layer(4, 99.64)] }),
      },
      'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user } = renderWorkspace();
    await screen.findByRole('grid', { name: 'Layer grid' });

    await user.click(screen.getByRole('button', { name: 'Submit for approval' }));
    const ask = within(await screen.findByRole('dialog', { name: 'Submit version 1 for approval?' }));
    await user.click(ask.getByRole('button', { name: 'Submit' }));

    expect(await screen.findByText(/Version 1 is submitted and read-only/)).toBeTruthy();
    expect(api.calls('POST', `${VERSION_URL}/submit`).map((r) => r.body)).toEqual([{ rowVersion: 3 }]);
    expect(screen.queryByRole('toolbar', { name: 'Layer tools' })).toBeNull();
  });

  it('shows a submitted version read-only and starts a new version from it', async () => {
    const onVersionChange = vi.fn();
    const api = mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: {
        status: 200,
        body: testVersion({ status: 'submitted', layers: [layer(4, 99.64)] }),
      },
      'POST /api/designs/12/versions': {
        status: 201,
        body: testVersion({ number: 2, layers: [layer(4, 99.64)] }),
      },
      'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
    });
    const { user } = renderWorkspace({ onVersionChange });
    await screen.findByRole('grid', { name: 'Layer grid' });

    expect(screen.queryByRole('toolbar', { name: 'Layer tools' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Save' })).toBeNull();
    expect(screen.getByText(/Version 1 is submitted and read-only/)).toBeTruthy();

    await user.click(screen.getByRole('button', { name: 'Start new version' }));
    await waitFor(() => expect(onVersionChange).toHaveBeenCalledWith(2));
    expect(api.calls('POST', '/api/designs/12/versions').map((r) => r.body)).toEqual([{ fromNumber: 1 }]);
  });
  it('after an approval step shows the new status in the approval panel and the editor', async () => {
    const submitted = testVersion({ status: 'submitted', rowVersion: 2, layers: [layer(4, 99.64)] });
    const event = {
      id: 1,
      designId: 12,
      versionNumber: 1,
      from: 'draft',
      to: 'submitted',
      actor: { id: 2, displayName: 'Tomas Reyne', role: 'engineer' },
      comment: '',
      at: '2026-12-01T09:00:00.000Z',
    };
    const approvedEvent = {
      ...event,
      id: 2,
      from: 'submitted',
      to: 'approved',
      actor: { id: 9, displayName: 'Ines Review', role: 'engineer' },
    };
    const api = mockWorkspaceApi({
      [`GET ${VERSION_URL}`]: { status: 200, body: submitted },
      [`POST ${VERSION_URL}/approve`]: {
        status: 201,
        body: { ...submitted, status: 'approved', rowVersion: 3 },
      },
      'GET /api/designs/12/history': [
        { status: 200, body: [event] },
        { status: 200, body: [event, approvedEvent] },
      ],
      'GET /api/designs/12': { status: 200, body: TEST_DESIGN },
      'GET /api/designs': { status: 200, body: [] },
      // The design workspace page composes the approval panel: it needs the session and the page's data.
      'GET /api/auth/session': { status: 200, body: { user: REVIEWER } },
      'GET /api/materials': { status: 200, body: TEST_MATERIALS },
      'GET /api/spec-masks/6': {
        status: 200,
        body: {
          id: 6,
          name: 'Fenwick lens AR',
          revision: 'A',
          customer: TEST_DESIGN.customer,
          bands: MASK,
          notes: '',
        },
      },
    });
    const { user } = renderApp('/designs/12?version=1');
    expect(
      await screen.findByText(/Version 1 is submitted and read-only/, undefined, { timeout: 10_000 }),
    ).toBeTruthy();

    await user.click(screen.getByRole('tab', { name: 'Approval & history' }));
    await user.click(await screen.findByRole('button', { name: 'Approve' }));
    const dialog = within(await screen.findByRole('dialog', { name: 'Approve version 1' }));
    await user.click(dialog.getByRole('button', { name: 'Approve' }));

    expect(await screen.findByText(/Version 1 is approved and read-only/)).toBeTruthy();
    expect(screen.queryByText(/Version 1 is submitted and read-only/)).toBeNull();
    expect(screen.getByLabelText('Version status').textContent).toBe('Version 1: approved');
    expect(screen.getByRole('button', { name: 'Release' })).toBeTruthy();
    expect(api.calls('POST', `${VERSION_URL}/approve`).map((r) => r.body)).toEqual([{}]);
    await waitFor(() =>
      expect(within(screen.getByRole('table', { name: 'Design history' })).getAllByRole('row')).toHaveLength(
        3,
      ),
    );
  });
});
