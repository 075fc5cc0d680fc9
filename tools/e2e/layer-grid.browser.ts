import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from './browser.js';
import {
  browserSession,
  createDesignInBrowser,
  demoUser,
  layerCell,
  maskResult,
  openWorkspaceTab,
} from './demo-shop.js';

/*
 * An engineer works the Layer grid as a spreadsheet: a block copied from a spreadsheet with a
 * semicolon separator, decimal commas and a QWOT header is pasted with Ctrl+V, undone and redone;
 * a material is chosen with the keyboard in a new row and Tab walks the editable cells. The
 * preview starts on the range of Halden's mask (420–680 nm at 0, 15 and 30°, see demo-shop.ts) and
 * keeps the range the engineer sets after a reload.
 */

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

function grid(page: import('playwright-core').Page) {
  return page.getByRole('grid', { name: 'Layer grid' });
}

/** Puts `text` on the page's clipboard, as copying cells in a spreadsheet does. */
async function copyToClipboard(page: import('playwright-core').Page, text: string): Promise<void> {
  type WithClipboard = { navigator: { clipboard: { writeText(t: string): Promise<void> } } };
  await page.evaluate((t) => (globalThis as unknown as WithClipboard).navigator.clipboard.writeText(t), text);
}

async function rowCount(page: import('playwright-core').Page): Promise<number> {
  return (await grid(page).getByRole('row').count()) - 1;
}

describe('Layer grid as a spreadsheet', () => {
  it('pastes a block with Ctrl+V, undoes and redoes it, and takes a material chosen with Enter', async () => {
    const { context, page, pageErrors } = await browserSession(browser, demoUser('mira.castell'));
    await context.grantPermissions(['clipboard-read', 'clipboard-write']);
    await createDesignInBrowser(page, `Paste check ${Date.now()}`, [['MgF2', 96.8]]);
    await expect.poll(() => rowCount(page)).toBe(1);

    // A quarter wave of each at 550 nm: QWOT 1 shown back as 1.0000 (QWOT = 4·n·d/λ, Macleod ch. 2).
    await layerCell(page, 1, 1).click();
    await copyToClipboard(page, 'Material;QWOT;Notes\nTiO2;1,0;H\nSiO2;1;L\nTiO2;0,5;half\n');
    await page.keyboard.press('Control+V');
    await expect.poll(() => rowCount(page)).toBe(4);
    expect(await layerCell(page, 2, 1).innerText()).toBe('TiO2');
    expect(await layerCell(page, 2, 3).innerText()).toBe('1.0000');
    expect(await layerCell(page, 3, 1).innerText()).toBe('SiO2');
    expect(await layerCell(page, 3, 3).innerText()).toBe('1.0000');
    expect(await layerCell(page, 4, 3).innerText()).toBe('0.5000');

    // Undo takes the whole paste back; redo brings it again.
    await page.getByRole('heading', { name: 'Layer grid' }).click();
    await page.keyboard.press('Control+Z');
    await expect.poll(() => rowCount(page)).toBe(1);
    await page.keyboard.press('Control+Shift+Z');
    await expect.poll(() => rowCount(page)).toBe(4);

    // A bad block adds nothing and says why.
    await layerCell(page, 4, 1).click();
    await copyToClipboard(page, 'MgF2\t90\nUnobtainium\t10\n');
    await page.keyboard.press('Control+V');
    await page.getByRole('list', { name: 'Paste problems' }).waitFor();
    expect(await page.getByRole('list', { name: 'Paste problems' }).innerText()).toContain(
      'Row 2: unknown material "Unobtainium"',
    );
    expect(await rowCount(page)).toBe(4);

    // A new row: choose the material with the keyboard, then Tab to the thickness and type it.
    await page.getByRole('button', { name: 'Add layer' }).click();
    await expect.poll(() => rowCount(page)).toBe(5);
    await layerCell(page, 5, 1).click();
    await page.keyboard.press('Enter');
    await page.getByRole('listbox').waitFor();
    await page.getByRole('option', { name: 'SiO2', exact: true }).press('Enter');
    await expect.poll(() => layerCell(page, 5, 1).innerText()).toMatch(/^SiO2/);
    await page.keyboard.press('Tab');
    await page.keyboard.press('Enter');
    await page.keyboard.type('80');
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
    await page.keyboard.press('Escape');
    await expect.poll(() => layerCell(page, 5, 2).innerText()).toBe('80.00');
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('starts the preview on the range of the mask and keeps the range set for the design after a reload', async () => {
    const { context, page, pageErrors } = await browserSession(browser, demoUser('mira.castell'));
    await createDesignInBrowser(page, `Range check ${Date.now()}`, [['MgF2', 96.8]]);
    await expect.poll(() => maskResult(page).innerText(), { timeout: 20_000 }).toMatch(/Pass|Fail/);
    const preview = page.getByRole('region', { name: 'Instant preview' });
    // 420–680 nm with a tenth of the span (26 nm) either side, rounded outward to 10 nm.
    expect(await preview.getByLabel('From (nm)').inputValue()).toBe('390');
    expect(await preview.getByLabel('To (nm)').inputValue()).toBe('710');
    expect(await preview.getByLabel('Angles (°)').inputValue()).toBe('0, 15, 30');
    // Every band is inside the plotted range: the x axis reaches past 680 nm.
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByText('No unsaved changes').waitFor();

    await preview.getByLabel('To (nm)').fill('900');
    await page.reload();
    const again = page.getByRole('region', { name: 'Instant preview' });
    await again.getByLabel('To (nm)').waitFor();
    expect(await again.getByLabel('To (nm)').inputValue()).toBe('900');
    expect(await again.getByLabel('From (nm)').inputValue()).toBe('390');

    // Compare keeps its own range, from the mask too.
    await openWorkspaceTab(page, 'Compare');
    const compare = page.getByRole('region', { name: 'Compare versions' });
    expect(await compare.getByLabel('From (nm)').inputValue()).toBe('390');
    expect(await compare.getByLabel('To (nm)').inputValue()).toBe('710');
    expect(await compare.getByLabel('Angle (°)').inputValue()).toBe('0');
    expect(pageErrors).toEqual([]);
    await context.close();
  });
});
