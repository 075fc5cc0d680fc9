import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser, type DemoSignIn } from './browser.js';
import {
  FOUR_LAYER_AR,
  browserSession,
  createDesignInBrowser,
  demoUser,
  openWorkspaceTab,
  startRunInDialog,
} from './demo-shop.js';

/*
 * Four-eyes approval to the chamber floor. Mira Castell (engineer) designs the demo's four-layer AR
 * stack (demo-shop.ts) for Halden Vision Systems' mask and submits it; the client and the API both
 * refuse to let her approve it. Tomas Reyes (engineer) approves and releases it. Jonah Pike
 * (operator) opens it under Released recipes and prints its run sheet for the demo chamber
 * "Box coater B2" (monitor 550 nm; SiO2 tooling factor 1.04, rate 0.8 nm/s — demo data).
 */

let browser: Browser;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const context of contexts) await context.close();
  await browser?.close();
});

async function session(who: DemoSignIn): Promise<{ page: Page; pageErrors: string[] }> {
  const { context, page, pageErrors } = await browserSession(browser, who);
  contexts.push(context);
  return { page, pageErrors };
}

/** A call to the API with the page's session cookie: status, content type and the start of the body. */
async function apiCall(page: Page, method: string, path: string) {
  return page.evaluate(
    async ({ method, path }) => {
      const res = await fetch(path, {
        method,
        // The header the client's fetch wrapper sends (CSRF_HEADER in shared).
        headers: { 'Content-Type': 'application/json', 'x-quietglass-request': '1' },
        body: method === 'GET' ? undefined : '{}',
      });
      const bytes = new Uint8Array(await res.arrayBuffer());
      const text = new TextDecoder().decode(bytes);
      return {
        status: res.status,
        type: res.headers.get('content-type') ?? '',
        head: text.slice(0, 5),
        json: (res.headers.get('content-type') ?? '').includes('json') ? (JSON.parse(text) as unknown) : null,
      };
    },
    { method, path },
  );
}

function statusChip(page: Page) {
  return page.getByRole('region', { name: 'Approval' }).getByLabel('Version status');
}

describe('approval and release', () => {
  it('the author submits, cannot approve; a second engineer approves and releases; the operator prints the run sheet and starts a run', async () => {
    // Engineer A writes and submits version 1.
    const mira = await session(demoUser('mira.castell'));
    let page = mira.page;
    const name = `HVS-2210 release check ${Date.now()}`;
    const designId = await createDesignInBrowser(page, name, FOUR_LAYER_AR);
    const designUrl = page.url();
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByText('No unsaved changes').waitFor();
    await openWorkspaceTab(page, 'Approval & history');
    await page.getByRole('button', { name: 'Submit for approval' }).click();
    const confirm = page.getByRole('dialog', { name: 'Submit version 1 for approval?' });
    await confirm.getByRole('button', { name: 'Submit', exact: true }).click();
    await expect.poll(() => statusChip(page).innerText()).toBe('Version 1: submitted');

    // Four-eyes: the client says why, and the API refuses her all the same.
    const approveOwn = page.getByRole('button', { name: 'Approve', exact: true });
    expect(await approveOwn.isDisabled()).toBe(true);
    await page.getByText('You wrote this version; another engineer approves it').waitFor();
    const refused = await apiCall(page, 'POST', `/api/designs/${designId}/versions/1/approve`);
    expect(refused.status).toBe(403);
    expect((refused.json as { message: string }).message).toBe(
      'Four-eyes rule: another engineer must approve version 1; you wrote or submitted it',
    );
    expect(mira.pageErrors).toEqual([]);

    // Engineer B approves and releases.
    const tomas = await session(demoUser('tomas.reyes'));
    page = tomas.page;
    await page.goto(designUrl);
    await openWorkspaceTab(page, 'Approval & history');
    await expect.poll(() => statusChip(page).innerText()).toBe('Version 1: submitted');
    await page.getByRole('button', { name: 'Approve', exact: true }).click();
    const approve = page.getByRole('dialog', { name: 'Approve version 1' });
    await approve.getByLabel('Comment').fill('Margins fine at 30°');
    await approve.getByRole('button', { name: 'Approve', exact: true }).click();
    await expect.poll(() => statusChip(page).innerText()).toBe('Version 1: approved');
    await page.getByText('Version 1 is approved and read-only', { exact: false }).waitFor();
    await page.getByRole('button', { name: 'Release', exact: true }).click();
    await page
      .getByRole('dialog', { name: 'Release version 1 as a recipe' })
      .getByRole('button', { name: 'Release', exact: true })
      .click();
    await expect.poll(() => statusChip(page).innerText()).toBe('Version 1: released');
    const history = page.getByRole('table', { name: 'Design history' });
    // Header, then released, approved, submitted and the author's save (every save is recorded).
    await expect.poll(() => history.getByRole('row').count()).toBe(5);
    expect(await history.getByRole('row').filter({ hasText: 'submitted → approved' }).innerText()).toMatch(
      /Tomas Reyes\s+1\s+submitted → approved\s+Margins fine at 30°/,
    );
    expect(tomas.pageErrors).toEqual([]);

    // The operator finds the recipe and its run sheet for Box coater B2.
    const jonah = await session(demoUser('jonah.pike'));
    page = jonah.page;
    await page.goto(`${baseUrl()}/recipes`);
    await page.getByRole('link', { name, exact: true }).click();
    await page.waitForURL(new RegExp(`/recipes/${designId}/1`));
    await page.getByLabel('Chamber').selectOption({ label: 'Box coater B2' });
    const layers = page.getByRole('table', { name: 'Run sheet layers' });
    await layers.waitFor();
    // Body rows plus header and totals.
    await expect.poll(() => layers.getByRole('row').count()).toBe(6);
    // On a 1440 px screen the whole sheet fits beside the navigation: no sideways scrolling.
    const sideways = 'document.documentElement.scrollWidth - document.documentElement.clientWidth';
    expect(await page.evaluate(sideways)).toBe(0);
    const firstStep = (await layers.getByRole('row').nth(1).getByRole('cell').allInnerTexts()).map((t) =>
      t.trim(),
    );
    // Step 1 is SiO2, next to the glass. By hand: monitor = 89.3 ÷ 1.04 = 85.87 nm; time = 85.865 ÷ 0.8
    // = 107.3 s (tooling factor = part ÷ monitor, rates at the monitor).
    expect(firstStep.slice(0, 9)).toEqual([
      '1',
      '4',
      'SiO2',
      '89.30',
      '1.040',
      '85.87',
      expect.any(String),
      '0.80',
      '107.3',
    ]);
    const chamberId = new URL(page.url()).searchParams.get('chamberId');
    const json = await apiCall(
      page,
      'GET',
      `/api/recipes/${designId}/1/run-sheet?chamberId=${chamberId}&monitorWavelengthNm=550`,
    );
    expect(json.status).toBe(200);
    const sheet = json.json as {
      layers: { qwotAtMonitor: number; monitorThicknessNm: number }[];
      cautions: string[];
    };
    const step1 = sheet.layers[0]!;
    expect(step1.monitorThicknessNm).toBeCloseTo(89.3 / 1.04, 9);
    expect(firstStep[6]).toBe(step1.qwotAtMonitor.toFixed(3));

    const cautions = page.getByRole('region', { name: 'Safety cautions' });
    expect(await cautions.innerText()).toMatch(/high voltage/);
    expect(await cautions.innerText()).toMatch(/shop’s own safety procedures.*local regulations/s);
    expect(await cautions.locator('li').count()).toBe(sheet.cautions.length);
    expect(await page.getByRole('figure', { name: 'Expected monitor signal' }).count()).toBe(1);

    // On paper: no top bar, navigation or page buttons; the layer table and cautions stay.
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('nav[aria-label="Main"]').isVisible()).toBe(false);
    expect(await page.locator('header.MuiAppBar-root').isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    expect(await layers.isVisible()).toBe(true);
    expect(await cautions.isVisible()).toBe(true);
    await page.emulateMedia({ media: 'screen' });

    const pdfHref = await page.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
    expect(pdfHref).toBe(
      `/api/recipes/${designId}/1/run-sheet.pdf?chamberId=${chamberId}&monitorWavelengthNm=550`,
    );
    const pdf = await apiCall(page, 'GET', pdfHref ?? '');
    expect(pdf.status).toBe(200);
    expect(pdf.type).toBe('application/pdf');
    expect(pdf.head).toBe('%PDF-');

    // From the sheet to the chamber: the run dialog opens with this recipe chosen.
    await page.getByRole('link', { name: 'Start a run' }).click();
    await page.waitForURL(/\/runs\?recipe=/);
    const recipeField = page.getByRole('dialog', { name: 'Start a run' }).getByLabel('Released recipe');
    await expect
      .poll(async () => recipeField.locator('option:checked').innerText())
      .toBe(`${name} v1 (Halden Vision Systems)`);
    const lot = `L-REL-${Date.now() % 100000}`;
    await startRunInDialog(page, null, lot);
    expect(await page.getByRole('region', { name: 'Layer readings' }).getByRole('row').count()).toBe(5);
    expect(jonah.pageErrors).toEqual([]);
  });
});
