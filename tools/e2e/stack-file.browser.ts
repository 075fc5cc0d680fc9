import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { engineBackSurface, type DesignVersionView, type SpectrumComparisonView } from '@quietglass/shared';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser } from './browser.js';
import {
  apiJson,
  apiSession,
  browserSession,
  demoUser,
  expectedMeasuredVerdict,
  startRunInDialog,
} from './demo-shop.js';

/*
 * Files in and out, end to end: the engineer Mira Castell exports the demo's released recipe
 * "HVS-2210 four-layer AR" version 1 as a stack file from the design workspace; the command-line
 * calculator (tools/calc, what `npm run calc` runs) computes its reflectance from that file at 8°,
 * unpolarised, as R fractions; the operator Jonah Pike uploads that CSV as is to a run of the same recipe. The run
 * page must then read it as percent and find it on the design curve the server computes itself:
 * the file carried every layer, material model and substrate exactly.
 */
const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const RECIPE = 'HVS-2210 four-layer AR';
const ANGLE_DEG = 8;

let browser: Browser;
let work: string;

beforeAll(async () => {
  browser = await launchBrowser();
  work = mkdtempSync(join(tmpdir(), 'qg-stack-file-'));
});
afterAll(async () => {
  await browser?.close();
  rmSync(work, { recursive: true, force: true });
});

describe('stack file', () => {
  it('export → CLI → spectrum upload: the CLI output of the exported file lies on the design curve', async () => {
    const api = await apiSession(demoUser('mira.castell'));
    const designs = await apiJson<{ id: number; name: string }[]>(api, 'get', '/api/designs');
    const design = designs.find((d) => d.name === RECIPE);
    if (!design) throw new Error(`the demo has no design ${RECIPE}`);
    const version = await apiJson<DesignVersionView>(api, 'get', `/api/designs/${design.id}/versions/1`);
    await api.dispose();
    expect(version.status).toBe('released');

    // The engineer exports version 1 from the workspace.
    const engineer = await browserSession(browser, demoUser('mira.castell'));
    await engineer.page.goto(`${baseUrl()}/designs/${design.id}?version=1`);
    const exportButton = engineer.page.getByRole('button', { name: 'Export stack file' });
    await expect.poll(() => exportButton.isEnabled(), { timeout: 20_000 }).toBe(true);
    const [download] = await Promise.all([engineer.page.waitForEvent('download'), exportButton.click()]);
    expect(download.suggestedFilename()).toBe('HVS-2210-four-layer-AR-v1.stack.json');
    const stackPath = join(work, download.suggestedFilename());
    await download.saveAs(stackPath);
    const file = JSON.parse(readFileSync(stackPath, 'utf8')) as { layers: { thickness_nm: number }[] };
    expect(file.layers.map((l) => l.thickness_nm)).toEqual(version.layers.map((l) => l.thicknessNm));
    expect(engineer.pageErrors).toEqual([]);
    await engineer.context.close();

    // The command-line calculator reads the file: R, T, A as fractions, 400–700 nm every 5 nm.
    // Its entry point, not `npm run calc`: that rebuilds shared/dist, which the running API and
    // worker load from (the CLI tests cover `npm run calc` itself).
    const csv = execFileSync(
      'npx',
      [
        'tsx',
        'tools/calc/main.ts',
        '--stack',
        stackPath,
        '--from',
        '400',
        '--to',
        '700',
        '--step',
        '5',
        '--angles',
        String(ANGLE_DEG),
        '--back',
        engineBackSurface(version.backSurface),
      ],
      { cwd: ROOT, encoding: 'utf8', timeout: 60_000 },
    );
    const [header, ...rows] = csv.trim().split('\n');
    expect(header).toBe('wavelength_nm,angle_deg,pol,R,T,A');
    expect(rows).toHaveLength(61);
    const cliPercent = rows.map((r) => 100 * Number(r.split(',')[3]));

    // The operator uploads the CLI's file unchanged to a run of the recipe.
    const operator = await browserSession(browser, demoUser('jonah.pike'));
    const page = operator.page;
    await page.goto(`${baseUrl()}/runs`);
    await page.getByRole('button', { name: 'Start a run' }).click();
    const lot = `L-CLI-${Date.now() % 100000}`;
    await startRunInDialog(page, `${RECIPE} v1 (Halden Vision Systems)`, lot);
    const runId = Number(/\/runs\/(\d+)$/.exec(page.url())![1]);
    const upload = page.getByRole('region', { name: 'Spectrum upload' });
    await upload.getByLabel('Spectrum file').setInputFiles({
      name: 'cli-output.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(csv),
    });
    await upload.getByLabel('Angle of incidence (°)').fill(String(ANGLE_DEG));
    await upload.getByRole('button', { name: 'Upload spectrum' }).click();
    // The file has R and T: nothing is saved until the operator says which one was measured.
    const problems = upload.getByRole('list', { name: 'Problems in the file' });
    await problems.waitFor();
    expect(await problems.getByRole('listitem').allInnerTexts()).toEqual([
      'row 1: header "wavelength_nm,angle_deg,pol,R,T,A": both R and T columns: choose the quantity to upload, or upload one quantity per file (expected e.g. wavelength_nm,R_percent)',
    ]);
    await upload.getByLabel('Quantity').selectOption('R');
    await upload.getByRole('button', { name: 'Upload spectrum' }).click();
    const comparison = page.getByRole('region', { name: 'Comparison with design and mask' });
    const verdict = comparison.getByRole('status', { name: 'Measured against the mask' });
    await expect.poll(() => verdict.innerText(), { timeout: 20_000 }).toMatch(/Pass|Fail/);

    // As stored: the CLI's fractions read as percent, and on the server's own design curve.
    const run = await page.request.get(`${baseUrl()}/api/runs/${runId}`);
    expect(run.ok()).toBe(true);
    const [spectrum] = (
      (await run.json()) as { spectra: { id: number; angleDeg: number; quantity: string }[] }
    ).spectra;
    expect(spectrum).toMatchObject({ angleDeg: ANGLE_DEG, quantity: 'R' });
    const res = await page.request.get(`${baseUrl()}/api/runs/${runId}/spectra/${spectrum!.id}/comparison`);
    expect(res.ok()).toBe(true);
    const view = (await res.json()) as SpectrumComparisonView;
    expect(view.measured.valuesPercent).toHaveLength(61);
    view.measured.valuesPercent.forEach((v, i) => expect(v).toBeCloseTo(cliPercent[i]!, 9));
    expect(view.design.wavelengthsNm).toEqual(view.measured.wavelengthsNm);
    const worstGap = Math.max(...view.design.valuesPercent.map((d, i) => Math.abs(d - cliPercent[i]!)));
    expect(worstGap).toBeLessThan(1e-9);

    // The page's verdict is the mask's verdict on the CLI's numbers.
    const expected = expectedMeasuredVerdict(view.mask!.limits, {
      quantity: 'R',
      angleDeg: ANGLE_DEG,
      wavelengthsNm: view.measured.wavelengthsNm,
      valuesPercent: cliPercent,
    });
    const text = await verdict.innerText();
    expect(text).toContain(expected.verdict);
    expect(text).toContain(expected.worstLine);
    expect(operator.pageErrors).toEqual([]);
    await operator.context.close();
  }, 120_000);
});
