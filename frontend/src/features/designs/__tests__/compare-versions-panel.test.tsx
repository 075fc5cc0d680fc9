import { screen, waitFor, within } from '@testing-library/react';
import type { DesignVersionContent } from '@quietglass/shared';
import { describe, expect, it, vi } from 'vitest';
import { TEST_MATERIALS, testVersion } from '../../../test/design-fixtures';
import { mockApi } from '../../../test/mock-api';
import { tracesOf } from '../../../test/plot-mock';
import { renderWithProviders } from '../../../test/render';
import { CompareVersionsPanel } from '../components/compare-versions-panel';
import { createInlinePreviewComputer } from '../../../lib/preview/preview-computer';
import { PreviewComputerProvider } from '../../../lib/preview/preview-context';

vi.mock('../../../components/plot', () => import('../../../test/plot-mock'));

// Quarter-wave MgF2 (n 1.38) on n 1.52 from air: minimum R = ((1.52 − 1.38²)/(1.52 + 1.38²))²
// = 1.2601 % at 550 nm (Macleod ch. 2). The bare n 1.52 surface: ((1 − 1.52)/(1 + 1.52))² = 4.2580 %
// at every wavelength (Hecht ch. 4), the index not dispersing.
const QUARTER_WAVE: DesignVersionContent = {
  ...testVersion(),
  layers: [{ materialId: 4, thicknessNm: 550 / (4 * 1.38), locked: false, notes: '' }],
};

function renderPanel(versionCount: number) {
  const versions = Array.from({ length: versionCount }, (_, i) => ({ number: i + 1, status: 'draft' }));
  return renderWithProviders(
    <PreviewComputerProvider computer={createInlinePreviewComputer()}>
      <CompareVersionsPanel
        designId={12}
        versions={versions}
        current={{ number: 1, content: QUARTER_WAVE }}
        library={TEST_MATERIALS}
        maskBands={null}
      />
    </PreviewComputerProvider>,
  );
}

describe('CompareVersionsPanel', () => {
  it('overlays the unsaved grid and a saved version, each computed by the preview engine', async () => {
    const api = mockApi({
      'GET /api/designs/12/versions/2': { status: 200, body: testVersion({ number: 2 }) },
    });
    const { user } = renderPanel(2);

    await user.click(screen.getByRole('checkbox', { name: /^Current grid/ }));
    await user.click(screen.getByRole('checkbox', { name: 'Version 2 (draft)' }));

    const figure = await screen.findByRole('figure', { name: 'Compared spectra' });
    await waitFor(() => expect(tracesOf(figure)).toHaveLength(2));
    const [current, bare] = tracesOf(figure) as [
      { name: string; y: number[] },
      { name: string; y: number[] },
    ];
    expect(current.name).toBe('Current grid');
    expect(bare.name).toBe('Version 2 (draft)');
    expect(Math.min(...current.y)).toBeCloseTo(1.2601, 3);
    expect(Math.min(...bare.y)).toBeCloseTo(4.258, 3);
    expect(Math.max(...bare.y)).toBeCloseTo(4.258, 3);
    expect(api.calls('GET', '/api/designs/12/versions/2')).toHaveLength(1);
  });

  it('takes at most four at once', async () => {
    mockApi(
      Object.fromEntries(
        [1, 2, 3, 4, 5].map((n) => [
          `GET /api/designs/12/versions/${n}`,
          { status: 200, body: testVersion({ number: n }) },
        ]),
      ),
    );
    const { user } = renderPanel(5);
    const group = within(screen.getByRole('group', { name: 'Versions to compare' }));
    for (const n of [1, 2, 3, 4])
      await user.click(group.getByRole('checkbox', { name: `Version ${n} (draft)` }));

    expect((group.getByRole('checkbox', { name: 'Version 5 (draft)' }) as HTMLInputElement).disabled).toBe(
      true,
    );
    expect((group.getByRole('checkbox', { name: /^Current grid/ }) as HTMLInputElement).disabled).toBe(true);
    await user.click(group.getByRole('checkbox', { name: 'Version 2 (draft)' }));
    expect((group.getByRole('checkbox', { name: 'Version 5 (draft)' }) as HTMLInputElement).disabled).toBe(
      false,
    );
  });
});
