import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, demoSignIns, launchBrowser, signIn } from './browser.js';

/*
 * An engineer designs a four-layer AR coating for the demo customer's mask "HVS-2210 lens AR"
 * (R ≤ 0.5 % over 420–680 nm at 0, 15 and 30°, unpolarised) on N-BK7 in air, front surface only.
 * Stack, incident side first: MgF2 96.8 nm / ZrO2 127.6 nm / Al2O3 84.2 nm / SiO2 76.2 nm on the
 * glass — thicknesses found with the optics engine for the demo shop's typical materials (worst
 * margin +0.12 percentage points, at 588 nm and 30°). The ZrO2 layer starts at 60 nm, far off, so
 * the mask fails (R ≈ 5.8 % at 420 nm) until it is corrected.
 */
const STACK_WITH_WRONG_ZRO2 = ['MgF2\t96.8', 'ZrO2\t60', 'Al2O3\t84.2', 'SiO2\t76.2'].join('\n');
const CORRECT_ZRO2_NM = '127.6';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

function maskResult(page: Page) {
  return page.getByRole('status', { name: 'Spec mask result' });
}

/** Cell `column` (0 = order, 1 = material, 2 = thickness nm, 3 = QWOT) of layer `layer` (1-based). */
function layerCell(page: Page, layer: number, column: number) {
  return page
    .getByRole('grid', { name: 'Layer grid' })
    .getByRole('row')
    .nth(layer)
    .getByRole('gridcell')
    .nth(column);
}

describe('design workspace', () => {
  it('an engineer designs a 4-layer AR stack, sees Fail turn to Pass, saves and runs the full analysis', async () => {
    const engineer = demoSignIns().find((s) => s.role === 'engineer');
    if (!engineer) throw new Error('no demo engineer');
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (error) => pageErrors.push(error.message));
    await signIn(page, engineer);

    await page.goto(`${baseUrl()}/designs`);
    await page.getByRole('button', { name: 'New design' }).click();
    const dialog = page.getByRole('dialog', { name: 'New design' });
    const name = `HVS-2210 four-layer AR ${Date.now()}`;
    await dialog.getByLabel('Name').fill(name);
    await dialog.getByLabel('Customer').selectOption({ label: 'Halden Vision Systems' });
    await dialog.getByLabel('Spec mask').selectOption({ label: 'HVS-2210 lens AR rev A' });
    await dialog.getByLabel('Incident medium').selectOption({ label: 'Air' });
    await dialog.getByLabel('Substrate', { exact: true }).selectOption({ label: 'N-BK7' });
    await dialog.getByLabel('Substrate thickness (mm)').fill('2');
    await dialog.getByLabel('Back surface').selectOption('front-only');
    await dialog.getByLabel('Reference wavelength (nm)').fill('550');
    await dialog.getByRole('button', { name: 'Create design' }).click();
    await page.waitForURL(/\/designs\/\d+/);
    await page.getByRole('heading', { level: 1, name }).waitFor();

    await page.getByRole('button', { name: 'Paste rows…' }).click();
    const paste = page.getByRole('dialog', { name: 'Paste rows' });
    await paste.getByLabel('Rows from a spreadsheet').fill(STACK_WITH_WRONG_ZRO2);
    await paste.getByRole('button', { name: 'Add rows' }).click();
    await paste.waitFor({ state: 'hidden' });
    await expect.poll(() => layerCell(page, 4, 1).innerText()).toBe('SiO2');

    // The worker computes the preview: the wrong ZrO2 thickness fails the mask.
    await expect.poll(() => maskResult(page).innerText(), { timeout: 20_000 }).toMatch(/Fail/);
    expect(await maskResult(page).innerText()).toMatch(/Worst margin −\d/);

    const thickness = layerCell(page, 2, 2);
    await thickness.dblclick();
    const input = thickness.getByRole('textbox');
    await input.fill(CORRECT_ZRO2_NM);
    await input.press('Enter');
    await expect.poll(() => layerCell(page, 2, 2).innerText()).toBe('127.60');
    await expect.poll(() => maskResult(page).innerText(), { timeout: 20_000 }).toMatch(/Pass/);
    expect(await maskResult(page).innerText()).toMatch(/Worst margin \+0\.1\d\d percentage points/);

    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByText('No unsaved changes').waitFor();

    const analysis = page.getByRole('region', { name: 'Full analysis' });
    await analysis.getByLabel('From (nm)').fill('400');
    await analysis.getByLabel('To (nm)').fill('700');
    await analysis.getByLabel('Wavelengths').fill('151');
    await analysis.getByLabel('Angle from (°)').fill('0');
    await analysis.getByLabel('Angle to (°)').fill('30');
    await analysis.getByLabel('Angles', { exact: true }).fill('7');
    await analysis.getByLabel('Field profile at (nm)').fill('550');
    await analysis.getByRole('button', { name: 'Run analysis' }).click();

    const status = analysis.getByRole('status', { name: 'Analysis status' });
    await expect.poll(() => status.innerText(), { timeout: 45_000 }).toMatch(/completed/);
    const heatMap = analysis.getByRole('figure', { name: 'Heat map' });
    await expect
      .poll(() => heatMap.locator('.js-plotly-plot .heatmaplayer .hm').count(), { timeout: 20_000 })
      .toBe(1);
    expect(await analysis.getByRole('figure', { name: 'Field profile' }).count()).toBe(1);
    expect(pageErrors).toEqual([]);
    await context.close();
  });
});
