import type { MaterialView } from '@quietglass/shared';
import type { Browser, Locator } from 'playwright-core';
import { fileURLToPath } from 'node:url';
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
  await dialog.getByLabel('Provenance').selectOption('typical');
  await dialog.getByLabel('Source').fill('Invented for a browser test');
}

/** A published optical-constants file shipped with the product (public domain). */
const CAF2_FILE = fileURLToPath(
  new URL('../../backend/assets/optical-constants/substrate/caf2--malitson.yml', import.meta.url),
);

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

  it('imports a published constants file with its reference, reads a Sellmeier entered as B and λ, and retires a material', async () => {
    const mira = demoUser('mira.castell');
    const stamp = Date.now() % 100000;
    const { context, page, pageErrors } = await browserSession(browser, mira);
    await page.goto(`${baseUrl()}/materials`);
    await page.getByRole('gridcell', { name: 'Fused silica', exact: true }).click();
    const silica = page.getByRole('region', { name: 'Material Fused silica' });
    // The demo library's fused silica comes from Malitson, J. Opt. Soc. Am. 55, 1205 (1965).
    expect(await silica.getByLabel('Provenance').textContent()).toMatch(
      /^Published reference: 1\) I\. H\. Malitson/,
    );
    expect(await silica.getByRole('link', { name: 'fused-silica--malitson.yml' }).count()).toBe(1);

    await page.getByRole('button', { name: 'Import published constants' }).click();
    const dialog = page.getByRole('dialog', { name: 'Import published constants' });
    await dialog.getByLabel('Constants file').setInputFiles(CAF2_FILE);
    const preview = dialog.getByRole('region', { name: 'Preview of the constants file' });
    await preview
      .getByText(/Malitson\. A redetermination of some optical properties of calcium fluoride/)
      .waitFor();
    expect(await preview.getByText(/valid 230–9700 nm/).count()).toBe(1);
    const name = `CaF2 stock ${stamp}`;
    await dialog.getByLabel('Material name').fill(name);
    await page.screenshot({ path: '/tmp/qg-materials-import.png' });
    await dialog.getByRole('button', { name: 'Import material' }).click();
    const detail = page.getByRole('region', { name: `Material ${name}` });
    await detail.waitFor();
    expect(await detail.getByLabel('Provenance').textContent()).toMatch(/DOI: 10\.1364\/AO\.2\.001103$/);

    // Sapphire ordinary ray as B and resonance wavelengths (Malitson & Dodge, J. Opt. Soc. Am. 62,
    // 1405 (1972)): n(589.3 nm) = 1.76808.
    await page.getByRole('button', { name: 'New material' }).click();
    const form = page.getByRole('dialog', { name: 'New material' });
    await form.getByLabel('Dispersion model').selectOption('sellmeier');
    await form.getByLabel('Enter the poles as').selectOption('lambda');
    const terms: [string, string][] = [
      ['1.4313493', '0.0726631'],
      ['0.65054713', '0.1193242'],
      ['5.3414021', '18.028251'],
    ];
    for (const [i, [b, l]] of terms.entries()) {
      await form.getByLabel(`B${i + 1}`, { exact: true }).fill(b);
      await form.getByLabel(`λ${i + 1} (µm)`).fill(l);
    }
    await form.getByLabel('Valid from (nm)').fill('200');
    await form.getByLabel('Valid to (nm)').fill('5000');
    await form.getByLabel('Reference wavelength (nm)').fill('589.3');
    await form.getByText('589.3 nm: n = 1.76808').waitFor();
    await page.screenshot({ path: '/tmp/qg-materials-sellmeier.png' });
    await form.getByRole('button', { name: 'Cancel' }).click();

    await detail.getByRole('button', { name: 'Retire' }).click();
    await detail.getByText(/^Retired .*no longer offered in pickers/).waitFor();
    await page.getByRole('gridcell', { name: 'Fused silica', exact: true }).click();
    await page.getByRole('gridcell', { name: `${name} (retired)` }).waitFor({ state: 'detached' });
    await page.getByLabel('Show retired materials').check();
    await page.getByRole('gridcell', { name: `${name} (retired)` }).waitFor();
    expect(pageErrors).toEqual([]);
    await context.close();
  });
});
