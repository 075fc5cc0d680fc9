import {
  CSRF_HEADER,
  evaluateMaskOnMeasured,
  type DesignVersionView,
  type LimitBand,
  type MeasuredSpectrum,
} from '@quietglass/shared';
import {
  request,
  type APIRequestContext,
  type Browser,
  type BrowserContext,
  type Page,
} from 'playwright-core';
import { baseUrl, demoSignIns, signIn, type DemoSignIn } from './browser.js';
import { expect } from 'vitest';

/*
 * The demo shop as the browser tests use it. The four-layer AR stack answers the demo customer's
 * mask "HVS-2210 lens AR" rev A (R ≤ 0.5 % over 420–680 nm at 0, 15 and 30°, unpolarised) on N-BK7
 * in air, front surface only. Incident side first: MgF2 94.2 nm / ZrO2 119.1 nm / Al2O3 79.6 nm /
 * SiO2 89.3 nm — thicknesses found with the optics engine's Fit to mask for the demo library's
 * published films (worst margin +0.096 percentage points).
 */
export const FOUR_LAYER_AR: readonly [material: string, thicknessNm: number][] = [
  ['MgF2', 94.2],
  ['ZrO2', 119.1],
  ['Al2O3', 79.6],
  ['SiO2', 89.3],
];
export const HALDEN = 'Halden Vision Systems';
export const HALDEN_MASK = { name: 'HVS-2210 lens AR', revision: 'A' } as const;

/** Rows for the Layer grid's "Paste rows" dialog: material, tab, thickness. */
export function pasteRows(stack: readonly (readonly [string, number])[]): string {
  return stack.map(([material, nm]) => `${material}\t${nm}`).join('\n');
}

/** The demo sign-in whose e-mail starts with `emailStart`, e.g. "mira.castell". */
export function demoUser(emailStart: string): DemoSignIn {
  const found = demoSignIns().find((s) => s.email.startsWith(emailStart));
  if (!found) throw new Error(`no demo sign-in ${emailStart}`);
  return found;
}

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  /** Uncaught errors of the page; a test ends by expecting none. */
  pageErrors: string[];
}

/** A fresh browser context signed in as `who`, on a wide screen. */
export async function browserSession(browser: Browser, who: DemoSignIn): Promise<BrowserSession> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const page = await context.newPage();
  const pageErrors: string[] = [];
  page.on('pageerror', (error) => pageErrors.push(error.message));
  await signIn(page, who);
  return { context, page, pageErrors };
}

/** The preview's mask verdict ("Pass · Worst margin …"). */
export function maskResult(page: Page) {
  return page.getByRole('status', { name: 'Spec mask result' });
}

/** Cell `column` (0 = order, 1 = material, 2 = thickness nm, 3 = QWOT) of layer `layer` (1-based). */
export function layerCell(page: Page, layer: number, column: number) {
  return page
    .getByRole('grid', { name: 'Layer grid' })
    .getByRole('row')
    .nth(layer)
    .getByRole('gridcell')
    .nth(column);
}

/**
 * Through the New design dialog: a design for Halden's lens mask on 2 mm N-BK7 in air, front surface
 * only, reference 550 nm, with `stack` pasted into the Layer grid (not saved yet). Returns its id.
 */
export async function createDesignInBrowser(
  page: Page,
  name: string,
  stack: readonly (readonly [string, number])[],
): Promise<number> {
  await page.goto(`${baseUrl()}/designs`);
  await page.getByRole('button', { name: 'New design' }).click();
  const dialog = page.getByRole('dialog', { name: 'New design' });
  await dialog.getByLabel('Name').fill(name);
  await dialog.getByLabel('Customer').selectOption({ label: HALDEN });
  await dialog
    .getByLabel('Spec mask')
    .selectOption({ label: `${HALDEN_MASK.name} rev ${HALDEN_MASK.revision}` });
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
  await paste.getByLabel('Rows from a spreadsheet').fill(pasteRows(stack));
  await paste.getByRole('button', { name: 'Add rows' }).click();
  await paste.waitFor({ state: 'hidden' });
  return Number(/\/designs\/(\d+)/.exec(page.url())?.[1]);
}

/** An API session of a demo user (the session cookie stays in the context); dispose it when done. */
export async function apiSession(who: DemoSignIn): Promise<APIRequestContext> {
  // Like the client's fetch wrapper, every request carries the header the API wants on changes.
  const api = await request.newContext({ baseURL: baseUrl(), extraHTTPHeaders: { [CSRF_HEADER]: '1' } });
  const res = await api.post('/api/auth/sign-in', { data: { email: who.email, password: who.password } });
  if (res.status() !== 200) throw new Error(`sign-in of ${who.email}: ${res.status()} ${await res.text()}`);
  return api;
}

/** A GET or POST that must succeed; its JSON answer. */
export async function apiJson<T>(
  api: APIRequestContext,
  method: 'get' | 'post',
  path: string,
  data?: object,
): Promise<T> {
  const res = method === 'get' ? await api.get(path) : await api.post(path, { data: data ?? {} });
  if (!res.ok()) throw new Error(`${method.toUpperCase()} ${path}: ${res.status()} ${await res.text()}`);
  return (await res.json()) as T;
}

export interface PreparedDesign {
  designId: number;
  name: string;
  /** Version 1 as the API holds it at the end (with its frozen materials). */
  version: DesignVersionView;
  maskBands: LimitBand[];
}

/**
 * Through the API, as the demo's two engineers: Mira Castell writes `stack` for Halden's lens mask
 * and submits version 1; Tomas Reyes approves it and, when `until` is "released", releases it.
 */
export async function prepareDesign(
  name: string,
  stack: readonly (readonly [string, number])[],
  until: 'approved' | 'released',
): Promise<PreparedDesign> {
  const author = await apiSession(demoUser('mira.castell'));
  const reviewer = await apiSession(demoUser('tomas.reyes'));
  try {
    const materials = await apiJson<{ id: number; name: string }[]>(author, 'get', '/api/materials');
    const material = (wanted: string) => {
      const found = materials.find((m) => m.name === wanted);
      if (!found) throw new Error(`the demo library has no ${wanted}`);
      return found.id;
    };
    const customers = await apiJson<{ id: number; name: string }[]>(author, 'get', '/api/customers');
    const customer = customers.find((c) => c.name === HALDEN);
    if (!customer) throw new Error(`no demo customer ${HALDEN}`);
    const masks = await apiJson<{ id: number; name: string; revision: string; bands: LimitBand[] }[]>(
      author,
      'get',
      `/api/spec-masks?customerId=${customer.id}`,
    );
    const mask = masks.find((m) => m.name === HALDEN_MASK.name && m.revision === HALDEN_MASK.revision);
    if (!mask) throw new Error(`${HALDEN} has no mask ${HALDEN_MASK.name} rev ${HALDEN_MASK.revision}`);
    const design = await apiJson<{ id: number }>(author, 'post', '/api/designs', {
      name,
      customerId: customer.id,
      specMaskId: mask.id,
      incidentMaterialId: material('Air'),
      substrateMaterialId: material('N-BK7'),
      substrateThicknessMm: 2,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      layers: stack.map(([m, thicknessNm]) => ({ materialId: material(m), thicknessNm })),
    });
    const path = `/api/designs/${design.id}/versions/1`;
    await apiJson(author, 'post', `${path}/submit`, { rowVersion: 1 });
    await apiJson(reviewer, 'post', `${path}/approve`);
    if (until === 'released') await apiJson(reviewer, 'post', `${path}/release`);
    const version = await apiJson<DesignVersionView>(author, 'get', path);
    return { designId: design.id, name, version, maskBands: mask.bands };
  } finally {
    await author.dispose();
    await reviewer.dispose();
  }
}

/**
 * In the open "Start a run" dialog: picks the recipe (unless `recipeLabel` is null, when the page
 * chose it already), the demo chamber "Box coater B2" and lot `lot`, starts the run and waits for
 * the run page.
 */
export async function startRunInDialog(page: Page, recipeLabel: string | null, lot: string): Promise<void> {
  const dialog = page.getByRole('dialog', { name: 'Start a run' });
  if (recipeLabel !== null) await dialog.getByLabel('Released recipe').selectOption({ label: recipeLabel });
  await dialog.getByLabel('Chamber').selectOption({ label: 'Box coater B2' });
  await dialog.getByLabel('Lot number').fill(lot);
  await dialog.getByRole('button', { name: 'Start run' }).click();
  await page.waitForURL(/\/runs\/\d+$/);
  await page.getByRole('heading', { level: 1, name: `Run ${lot}` }).waitFor();
}

/** Opens a tab of the design workspace below the grid and the plot ("Full analysis", "Optimise" …). */
export async function openWorkspaceTab(page: Page, name: string): Promise<void> {
  const tab = page.getByRole('tablist', { name: 'Workspace' }).getByRole('tab', { name, exact: true });
  // The scrollable tab strip may still be scrolling its selected tab into view right after a
  // (re)load, and a click then lands beside the tab: click until the tab is the selected one.
  for (let attempt = 0; attempt < 5; attempt++) {
    await tab.click();
    try {
      await expect.poll(() => tab.getAttribute('aria-selected'), { timeout: 3_000 }).toBe('true');
      return;
    } catch {
      // clicked while the strip moved; try again
    }
  }
  throw new Error(`the workspace tab "${name}" did not open after 5 clicks`);
}

/**
 * What the run page's "Measured against the mask" line must say of a measured spectrum, worked out
 * with the engine's own mask check: the verdict and "Worst margin ±x percentage points at λ nm".
 */
export function expectedMeasuredVerdict(
  bands: LimitBand[],
  measured: MeasuredSpectrum,
): { verdict: 'Pass' | 'Fail'; worstLine: string } {
  const expected = evaluateMaskOnMeasured({ bands }, measured);
  if (expected.worstMargin === null) throw new Error('the mask judged nothing of the measured spectrum');
  const worst = expected.bands.find((b) => b.worstMargin === expected.worstMargin);
  if (!worst?.worstAt) throw new Error('the worst band has no worst point');
  const sign = expected.worstMargin >= 0 ? '+' : '−';
  return {
    verdict: expected.pass ? 'Pass' : 'Fail',
    worstLine: `Worst margin ${sign}${Math.abs(expected.worstMargin).toFixed(3)} percentage points at ${worst.worstAt.wavelengthNm} nm`,
  };
}
