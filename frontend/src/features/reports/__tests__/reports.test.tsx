import { screen, waitFor, within } from '@testing-library/react';
import type { VersionStatus } from '@quietglass/shared';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { apiError, mockApi } from '../../../test/mock-api';
import { renderApp, renderWithProviders } from '../../../test/render';
import type { ReportView } from '../api/get-reports';
import { NewReportDialog } from '../components/new-report-dialog';

// The reports API (backend/src/reports): reports are made of approved or released versions only,
// against a spec mask of the design's customer (the design's own mask by default); runId and
// spectrumId go together. The dialog checks the API's own schema (shared/src/schemas/reports.ts).

const DESIGNS = [
  { id: 12, name: 'Fenwick lens AR', customer: { id: 3, name: 'Fenwick Optics Lab' }, specMaskId: 6 },
  { id: 14, name: 'Marlow window AR', customer: { id: 5, name: 'Marlow Scopes' }, specMaskId: null },
  // Designed against the shop's own tighter target, which a report never judges against.
  { id: 15, name: 'Fenwick lens AR tight', customer: { id: 3, name: 'Fenwick Optics Lab' }, specMaskId: 8 },
];
const MASKS = [
  { id: 6, name: 'Fenwick lens AR', revision: 'A', customer: { id: 3 }, kind: 'customer' as const },
  { id: 9, name: 'Fenwick lens AR', revision: 'B', customer: { id: 3 }, kind: 'customer' as const },
  { id: 7, name: 'Marlow window', revision: 'B', customer: { id: 5 }, kind: 'customer' as const },
  { id: 8, name: 'Fenwick design target', revision: 'T', customer: { id: 3 }, kind: 'internal' as const },
];
const VERSIONS: { number: number; status: VersionStatus }[] = [
  { number: 1, status: 'retired' },
  { number: 2, status: 'released' },
  { number: 3, status: 'submitted' },
  { number: 4, status: 'approved' },
  { number: 5, status: 'draft' },
];

/*
 * A report of an invented design: one band R ≤ 0.5 % failed by 0.762 percentage points at 420 nm,
 * as a single quarter-wave MgF2 layer on glass gives (≈ 1.26 % at the reference wavelength,
 * Macleod ch. 2; the band values here are demo data).
 */
const REPORT: ReportView = {
  id: 4,
  designId: 12,
  versionNumber: 4,
  specMaskId: 6,
  hideLayers: true,
  runId: null,
  spectrumId: null,
  summary: {
    source: 'designed',
    pass: false,
    worstMargin: -0.762,
    bands: [
      {
        band: 0,
        label: '',
        rule: 'R ≤ 0.5 % over 420–680 nm',
        angles: '0, 15, 30°',
        polarisation: 'avg',
        evaluated: true,
        pass: false,
        worstMargin: -0.762,
        worstAtNm: 420,
        valuePercent: 1.262,
      },
    ],
    colour: null,
  },
  createdBy: 'Ines Calder',
  createdAt: '2026-12-02T09:00:00.000Z',
};

function Harness(props: { onCreated: (r: ReportView) => void; allowMeasured?: boolean }) {
  const [designId, setDesignId] = useState<number | null>(null);
  return (
    <NewReportDialog
      open
      onClose={() => {}}
      onCreated={props.onCreated}
      designs={DESIGNS}
      masks={MASKS}
      versions={designId === 12 ? VERSIONS : undefined}
      onDesignChange={setDesignId}
      allowMeasured={props.allowMeasured}
    />
  );
}

const optionTexts = (select: HTMLElement) =>
  [...(select as HTMLSelectElement).options].map((o) => o.textContent ?? '');

describe('NewReportDialog', () => {
  it("offers only approved and released versions and the customer's masks, and posts the report", async () => {
    const api = mockApi({ 'POST /api/reports': { status: 201, body: REPORT } });
    const onCreated = vi.fn();
    const { user } = renderWithProviders(<Harness onCreated={onCreated} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New compliance report' }));

    await user.selectOptions(dialog.getByLabelText('Design'), '12');
    await waitFor(() =>
      expect(optionTexts(dialog.getByLabelText('Approved version'))).toEqual([
        'Choose…',
        'Version 2 (released)',
        'Version 4 (approved)',
      ]),
    );
    expect(optionTexts(dialog.getByLabelText('Spec mask'))).toEqual([
      'Choose…',
      'Fenwick lens AR rev A',
      'Fenwick lens AR rev B',
    ]);
    expect((dialog.getByLabelText('Spec mask') as HTMLSelectElement).value).toBe('6');
    expect(dialog.queryByLabelText('Run number')).toBeNull();
    await user.selectOptions(dialog.getByLabelText('Approved version'), '4');
    await user.selectOptions(dialog.getByLabelText('Spec mask'), '9');
    await user.click(dialog.getByLabelText('Hide the layer table (design not disclosed)'));
    await user.click(dialog.getByRole('button', { name: 'Create report' }));

    await waitFor(() => expect(onCreated).toHaveBeenCalledWith(REPORT));
    expect(api.calls('POST', '/api/reports').map((r) => r.body)).toEqual([
      { designId: 12, versionNumber: 4, specMaskId: 9, hideLayers: true },
    ]);
  });

  it("never offers an internal design target, not even as the design's own mask", async () => {
    mockApi({});
    const { user } = renderWithProviders(<Harness onCreated={vi.fn()} />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New compliance report' }));
    await user.selectOptions(dialog.getByLabelText('Design'), '15');
    const masks = dialog.getByLabelText('Spec mask') as HTMLSelectElement;
    expect(optionTexts(masks)).toEqual(['Choose…', 'Fenwick lens AR rev A', 'Fenwick lens AR rev B']);
    expect(masks.value).toBe('');
  });

  it('asks for a run and its spectrum together, and shows the API refusal', async () => {
    const api = mockApi({
      'POST /api/reports': apiError(
        400,
        'Bad Request',
        'Invalid input: runId: run 31 did not build design 12 version 2',
        ['runId: run 31 did not build design 12 version 2'],
      ),
    });
    const onCreated = vi.fn();
    const { user } = renderWithProviders(<Harness onCreated={onCreated} allowMeasured />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New compliance report' }));
    await user.selectOptions(dialog.getByLabelText('Design'), '12');
    await waitFor(() => expect(optionTexts(dialog.getByLabelText('Approved version'))).toHaveLength(3));
    await user.selectOptions(dialog.getByLabelText('Approved version'), '2');
    await user.type(dialog.getByLabelText('Run number'), '31');
    await user.click(dialog.getByRole('button', { name: 'Create report' }));
    expect(await dialog.findByText('Give the run and its spectrum together')).toBeTruthy();
    expect(api.requests).toHaveLength(0);

    await user.type(dialog.getByLabelText('Spectrum number'), '2');
    await user.click(dialog.getByRole('button', { name: 'Create report' }));
    expect(await dialog.findByText('runId: run 31 did not build design 12 version 2')).toBeTruthy();
    expect(api.calls('POST', '/api/reports')[0]!.body).toEqual({
      designId: 12,
      versionNumber: 2,
      specMaskId: 6,
      hideLayers: false,
      runId: 31,
      spectrumId: 2,
    });
    expect(onCreated).not.toHaveBeenCalled();
  });
  it("shows the API's messages for a run number that is not one and a design not chosen", async () => {
    const api = mockApi({});
    const { user } = renderWithProviders(<Harness onCreated={vi.fn()} allowMeasured />);
    const dialog = within(await screen.findByRole('dialog', { name: 'New compliance report' }));
    await user.type(dialog.getByLabelText('Run number'), 'R-31');
    await user.type(dialog.getByLabelText('Spectrum number'), '2');
    await user.click(dialog.getByRole('button', { name: 'Create report' }));
    expect(await dialog.findByText('Enter the run number')).toBeTruthy();
    expect(dialog.getByText('Choose the design')).toBeTruthy();
    expect(dialog.getByText('Choose an approved version')).toBeTruthy();
    expect(api.requests).toHaveLength(0);
  });
});

describe('report page', () => {
  it('previews the PDF, links its download and lists the band margins', async () => {
    mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.sales } },
      'GET /api/reports/4': { status: 200, body: REPORT },
      'GET /api/designs/12': {
        status: 200,
        body: {
          ...DESIGNS[0],
          createdBy: { id: 2, displayName: 'T' },
          createdAt: REPORT.createdAt,
          versions: [],
        },
      },
      'GET /api/spec-masks/6': { status: 200, body: { ...MASKS[0], bands: [], notes: '', version: 1 } },
    });
    renderApp('/reports/4');

    expect(await screen.findByRole('heading', { level: 1, name: 'Compliance report R-4' })).toBeTruthy();
    const frame = screen.getByTitle('Compliance report R-4 (PDF)');
    expect(frame.tagName).toBe('IFRAME');
    expect(frame.getAttribute('src')).toBe('/api/reports/4/pdf');
    const download = screen.getByRole('link', { name: 'Download PDF' });
    expect(download.getAttribute('href')).toBe('/api/reports/4/pdf');
    expect(download.getAttribute('download')).toBe('compliance-report-4.pdf');
    const margins = screen.getByRole('table', { name: 'Limit-band margins' });
    expect(within(margins).getAllByRole('row')[1]!.textContent).toBe(
      'Band 1R ≤ 0.5 % over 420–680 nm0, 15, 30°avgFAIL-0.762420.01.262',
    );
    await waitFor(() => expect(screen.getByText(/against Fenwick lens AR rev A/)).toBeTruthy());
    expect(screen.getByText(/The layer table is hidden/)).toBeTruthy();
  });
});
