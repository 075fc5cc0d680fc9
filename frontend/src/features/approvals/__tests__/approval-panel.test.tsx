import { screen, waitFor, within } from '@testing-library/react';
import type { DesignVersionView, UserView } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import type { VersionEventView } from '../api/get-design-history';
import { ApprovalPanel } from '../components/approval-panel';

// Answers follow the approvals API (backend/test/approvals.e2e-spec.ts): POST
// /designs/:id/versions/:n/{approve,return,release,retire}, 403 four-eyes message, 400 when a return
// has no comment, GET /designs/:id/history oldest first. People and designs are invented.

const MIRA: UserView = {
  id: 2,
  email: 'mira@example.test',
  displayName: 'Mira Castell',
  role: 'engineer',
  active: true,
  mustChangePassword: false,
  createdAt: '2026-11-01T08:00:00.000Z',
  version: 1,
};
const TOMAS: UserView = { ...MIRA, id: 3, email: 'tomas@example.test', displayName: 'Tomas Reyes' };
const ADMIN: UserView = {
  ...MIRA,
  id: 1,
  email: 'elin@example.test',
  displayName: 'Elin Voss',
  role: 'admin',
};

const HISTORY_URL = '/api/designs/12/history';
const FOUR_EYES_403 = 'Four-eyes rule: another engineer must approve version 1; you wrote or submitted it';

function event(overrides: Partial<VersionEventView>): VersionEventView {
  return {
    id: 1,
    designId: 12,
    versionNumber: 1,
    from: 'draft',
    to: 'submitted',
    actor: { id: 2, displayName: 'Mira Castell', role: 'engineer' },
    comment: '',
    at: '2026-12-01T09:00:00.000Z',
    kind: 'status',
    ...overrides,
  };
}

const SUBMITTED_BY_MIRA = event({});

function view(status: DesignVersionView['status'], createdById = 2): DesignVersionView {
  return {
    designId: 12,
    number: 1,
    status,
    rowVersion: 2,
    incidentMaterialId: 1,
    substrateMaterialId: 2,
    substrateThicknessMm: 2,
    backSurface: 'front-only',
    referenceWavelengthNm: 550,
    notes: '',
    layers: [],
    createdBy: { id: createdById, displayName: createdById === 2 ? 'Mira Castell' : 'Someone' },
    editors: [],
    createdAt: '2026-12-01T08:00:00.000Z',
    updatedAt: '2026-12-01T09:00:00.000Z',
    materialsSnapshot: null,
  };
}

function renderPanel(user: UserView, version: DesignVersionView, onTransitioned = vi.fn()) {
  const rendered = renderWithProviders(
    <ApprovalPanel version={version} userId={user.id} canAct onTransitioned={onTransitioned} />,
  );
  return { ...rendered, onTransitioned };
}

function button(name: string): HTMLButtonElement {
  return screen.getByRole('button', { name }) as HTMLButtonElement;
}

describe('ApprovalPanel four-eyes rule', () => {
  it('tells the author why she cannot approve or return her own version', async () => {
    mockApi({ [`GET ${HISTORY_URL}`]: { status: 200, body: [SUBMITTED_BY_MIRA] } });
    renderPanel(MIRA, view('submitted'));
    await screen.findByRole('table', { name: 'Design history' });

    expect(button('Approve').disabled).toBe(true);
    expect(button('Return…').disabled).toBe(true);
    const reason = document.getElementById(button('Approve').getAttribute('aria-describedby') ?? '');
    expect(reason?.textContent).toBe('You wrote this version; another engineer approves it');
  });

  it('tells the submitter the same when someone else wrote the version', async () => {
    const byTomas = event({ actor: { id: 3, displayName: 'Tomas Reyes', role: 'engineer' } });
    mockApi({ [`GET ${HISTORY_URL}`]: { status: 200, body: [byTomas] } });
    renderPanel(TOMAS, view('submitted', 2));
    await waitFor(() => expect(button('Approve').disabled).toBe(true));
    expect(screen.getByText('You submitted this version; another engineer approves it')).toBeTruthy();
  });

  it("shows the API's 403 message when the server refuses anyway", async () => {
    const api = mockApi({
      [`GET ${HISTORY_URL}`]: { status: 200, body: [] },
      'POST /api/designs/12/versions/1/approve': apiError(403, 'Forbidden', FOUR_EYES_403),
    });
    const { user, onTransitioned } = renderPanel(TOMAS, view('submitted', 5));
    await screen.findByText('No version of this design has been saved or submitted yet.');
    expect(button('Approve').disabled).toBe(false);

    await user.click(button('Approve'));
    const dialog = within(await screen.findByRole('dialog', { name: 'Approve version 1' }));
    await user.click(dialog.getByRole('button', { name: 'Approve' }));

    expect((await dialog.findByRole('alert')).textContent).toContain(FOUR_EYES_403);
    expect(api.calls('POST', '/api/designs/12/versions/1/approve')).toHaveLength(1);
    expect(onTransitioned).not.toHaveBeenCalled();
  });
});

describe('ApprovalPanel steps', () => {
  it('a return needs a comment: nothing is sent without one, the comment is sent with it', async () => {
    const returned = { ...view('returned'), rowVersion: 3 };
    const api = mockApi({
      [`GET ${HISTORY_URL}`]: { status: 200, body: [SUBMITTED_BY_MIRA] },
      'POST /api/designs/12/versions/1/return': { status: 201, body: returned },
    });
    const { user, onTransitioned } = renderPanel(TOMAS, view('submitted'));
    await screen.findByRole('table', { name: 'Design history' });

    await user.click(button('Return…'));
    const dialog = within(await screen.findByRole('dialog', { name: 'Return version 1 to its author' }));
    await user.click(dialog.getByRole('button', { name: 'Return' }));
    expect(await dialog.findByText('A return needs a comment: say what to change')).toBeTruthy();
    // Blanks are not a comment either.
    await user.type(dialog.getByLabelText('Comment'), '   ');
    await user.click(dialog.getByRole('button', { name: 'Return' }));
    expect(dialog.getByText('A return needs a comment: say what to change')).toBeTruthy();
    expect(api.calls('POST', '/api/designs/12/versions/1/return')).toHaveLength(0);

    await user.clear(dialog.getByLabelText('Comment'));
    await user.type(dialog.getByLabelText('Comment'), ' Outer layer too thin for abrasion ');
    await user.click(dialog.getByRole('button', { name: 'Return' }));

    await waitFor(() => expect(onTransitioned).toHaveBeenCalledWith(returned));
    expect(api.calls('POST', '/api/designs/12/versions/1/return').map((r) => r.body)).toEqual([
      { comment: 'Outer layer too thin for abrasion' },
    ]);
  });

  it('offers Release for an approved version and Retire for a released one', async () => {
    mockApi({ [`GET ${HISTORY_URL}`]: { status: 200, body: [] } });
    const first = renderPanel(TOMAS, view('approved'));
    expect(await screen.findByRole('button', { name: 'Release' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Approve' })).toBeNull();
    first.unmount();
    renderPanel(ADMIN, view('released'));
    expect(await screen.findByRole('button', { name: 'Retire' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Release' })).toBeNull();
  });

  it('lists the audit trail: when, who, version, from → to and comment', async () => {
    mockApi({
      [`GET ${HISTORY_URL}`]: {
        status: 200,
        body: [
          SUBMITTED_BY_MIRA,
          event({
            id: 2,
            from: 'submitted',
            to: 'returned',
            actor: { id: 3, displayName: 'Tomas Reyes', role: 'engineer' },
            comment: 'Check 680 nm',
            at: '2026-12-01T10:30:00.000Z',
          }),
        ],
      },
    });
    renderPanel(ADMIN, view('returned'));
    const table = await screen.findByRole('table', { name: 'Design history' });
    const rows = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) =>
        within(r)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      );
    const when = (iso: string) =>
      new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' }).format(new Date(iso));
    expect(rows).toEqual([
      [when('2026-12-01T09:00:00.000Z'), 'Mira Castell', '1', 'draft → submitted', '—'],
      [when('2026-12-01T10:30:00.000Z'), 'Tomas Reyes', '1', 'submitted → returned', 'Check 680 nm'],
    ]);
  });
});
