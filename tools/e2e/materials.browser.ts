import type { MaterialView } from '@quietglass/shared';
import type { Browser, Locator } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser } from './browser.js';
import { apiJson, apiSession, browserSession, demoUser, HALDEN } from './demo-shop.js';

/*
 * The demo engineer Mira Castell keeps the materials library: she adds a material (invented index
 * values, for this test only), and edits one that a submitted version froze, which makes its next
 * revision while the version keeps the one it was built with.
 */

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function fillMaterial(dialog: Locator, name: string, n: string): Promise<void> {
  await dialog.getByLabel('Name').fill(name);
  await dialog.getByLabel('n', { exact: true }).fill(n);
  await dialog.getByLabel('Valid from (nm)').fill('300');
  await dialog.getByLabel('Valid to (nm)').fill('1200');
  await dialog.getByLabel('Source').fill('Invented for a browser test');
}

describe('materials library', () => {
  it('an added material is the one shown; editing a frozen one makes its next revision', async () => {
    const mira = demoUser('mira.castell');
    const stamp = Date.now() % 100000;
    const { context, page, pageErrors } = await browserSession(browser, mira);
    await page.goto(`${baseUrl()}/materials`);
    await page.getByRole('gridcell', { name: 'SiO2', exact: true }).click();
    await page.getByRole('region', { name: 'Material SiO2' }).waitFor();

    const name = `Browser oxide ${stamp}`;
    await page.getByRole('button', { name: 'New material' }).click();
    const dialog = page.getByRole('dialog', { name: 'New material' });
    await fillMaterial(dialog, name, '1.71');
    await dialog.getByRole('button', { name: 'Add material' }).click();
    const detail = page.getByRole('region', { name: `Material ${name}` });
    await detail.waitFor();
    expect(await page.getByRole('region', { name: 'Material SiO2' }).count()).toBe(0);
    expect(await detail.getByText(/· revision 1 · version 1,/).count()).toBe(1);

    // A version that uses it is submitted (through the API): the material is now frozen there.
    const api = await apiSession(mira);
    const materials = await apiJson<MaterialView[]>(api, 'get', '/api/materials');
    const id = (n: string) => materials.find((m) => m.name === n)!.id;
    const customers = await apiJson<{ id: number; name: string }[]>(api, 'get', '/api/customers');
    const design = await apiJson<{ id: number }>(api, 'post', '/api/designs', {
      name: `Uses ${name}`,
      customerId: customers.find((c) => c.name === HALDEN)!.id,
      incidentMaterialId: id('Air'),
      substrateMaterialId: id('N-BK7'),
      substrateThicknessMm: 2,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      layers: [{ materialId: id(name), thicknessNm: 80.4 }],
    });
    await apiJson(api, 'post', `/api/designs/${design.id}/versions/1/submit`, { rowVersion: 1 });

    await detail.getByRole('button', { name: 'Edit' }).click();
    const edit = page.getByRole('dialog', { name: `Edit ${name}` });
    await edit.getByLabel('n', { exact: true }).fill('1.74');
    await edit.getByRole('button', { name: 'Save material' }).click();
    await edit.waitFor({ state: 'hidden' });
    await detail.getByText(/· revision 2 · version 2,/).waitFor();
    const earlier = detail.getByRole('region', { name: 'Earlier revisions' });
    const line = earlier.getByText(/^Revision 1: /);
    await line.waitFor();
    expect(await line.textContent()).toMatch(
      /n = 1\.71, k = 0 · valid 300–1200 nm · replaced .+ by Mira Castell$/,
    );
    // The submitted version keeps revision 1 in its frozen snapshot.
    const version = await apiJson<{
      materialsSnapshot: Record<string, { revision?: number; model: { n: number } }>;
    }>(api, 'get', `/api/designs/${design.id}/versions/1`);
    expect(version.materialsSnapshot[String(id(name))]).toMatchObject({ revision: 1, model: { n: 1.71 } });
    expect(pageErrors).toEqual([]);
    await api.dispose();
    await context.close();
  });
});
