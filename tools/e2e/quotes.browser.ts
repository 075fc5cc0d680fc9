import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser } from './browser.js';
import { FOUR_LAYER_AR, HALDEN, HALDEN_MASK, browserSession, demoUser, prepareDesign } from './demo-shop.js';

/*
 * Sales quote parts coated to an approved design and send the quote with a compliance report;
 * the local SMTP fake in the API process receives the e-mail, and the admin reads it in the
 * Outbox. The design is the demo scenario's four-layer AR stack for Halden's lens mask (see
 * demo-shop.ts), written and submitted by one engineer, approved by the other (four-eyes). Prices and the
 * contact are invented demo data.
 */
const CUSTOMER = HALDEN;
const MASK = HALDEN_MASK;

const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

let browser: Browser;
const stamp = Date.now();
const designName = `HVS-2210 quote design ${stamp}`;
const contact = `purchasing-${stamp}@halden-vision.example`;
const part = `Ø25 mm N-BK7 lens, AR front side (${stamp})`;

beforeAll(async () => {
  browser = await launchBrowser();
  const approved = await prepareDesign(designName, FOUR_LAYER_AR, 'approved');
  expect(approved.version.status).toBe('approved');
});
afterAll(async () => {
  await browser?.close();
});

describe('quotes', () => {
  it('sales quote an approved version, attach a new compliance report and send it; the admin finds it in the Outbox', async () => {
    const { context, page, pageErrors } = await browserSession(browser, demoUser('priya.nand'));

    await page.goto(`${baseUrl()}/quotes`);
    await page.getByRole('heading', { level: 1, name: 'Quotes' }).waitFor();
    await page.getByRole('button', { name: 'New quote' }).click();
    const form = page.getByRole('dialog', { name: 'New quote' });
    await form.getByLabel('Customer').selectOption({ label: CUSTOMER });
    await form.getByLabel('Contact e-mail').fill(contact);
    await form.getByLabel('Design').selectOption({ label: designName });
    const version = form.getByLabel('Approved version');
    await expect
      .poll(() => version.locator('option').allInnerTexts())
      .toEqual(['Choose…', 'Version 1 (approved)']);
    await version.selectOption({ label: 'Version 1 (approved)' });
    // The design's own mask comes with it.
    expect(await form.getByLabel('Spec mask').locator('option:checked').innerText()).toBe(
      `${MASK.name} rev ${MASK.revision}`,
    );
    await form.getByLabel('Part description').fill(part);
    await form.getByLabel('From quantity (break 1)').fill('10');
    await form.getByLabel('Unit price (break 1)').fill('42.50');
    await form.getByRole('button', { name: 'Add quantity break' }).click();
    await form.getByLabel('From quantity (break 2)').fill('100');
    await form.getByLabel('Unit price (break 2)').fill('31');
    await form.getByLabel('Lead time (days)').fill('21');
    const validUntil = inDays(45);
    await form.getByLabel('Valid until').fill(validUntil);
    await form.getByRole('button', { name: 'Create quote' }).click();

    await page.waitForURL(/\/quotes\/\d+$/);
    const quoteId = Number(new URL(page.url()).pathname.split('/').pop());
    await page.getByRole('heading', { level: 1, name: `Quote Q-${quoteId}` }).waitFor();
    const details = page.getByLabel('Quote details');
    expect(await details.innerText()).toContain(contact);
    expect(await details.innerText()).toContain(validUntil);
    expect(
      await page.getByRole('table', { name: 'Quantity breaks' }).getByRole('row').allInnerTexts(),
    ).toEqual([
      expect.stringMatching(/From quantity\s+Unit price \(EUR\)/),
      expect.stringMatching(/10 pcs\s+42\.50/),
      expect.stringMatching(/100 pcs\s+31\.00/),
    ]);

    // A new compliance report for the quote's design version and mask, attached on creation.
    await page.getByRole('button', { name: 'Attach reports' }).click();
    await page
      .getByRole('dialog', { name: 'Attach compliance reports' })
      .getByRole('button', { name: 'New report for this quote' })
      .click();
    const reportForm = page.getByRole('dialog', { name: 'New compliance report' });
    await reportForm.getByLabel('Hide the layer table (design not disclosed)').check();
    await reportForm.getByRole('button', { name: 'Create report' }).click();
    await reportForm.waitFor({ state: 'hidden', timeout: 30_000 });
    const attached = page.getByRole('list', { name: 'Attached compliance reports' }).getByRole('link');
    await expect.poll(() => attached.count(), { timeout: 20_000 }).toBe(1);
    const reportLabel = await attached.innerText();
    expect(reportLabel).toMatch(/^R-\d+$/);
    const reportId = Number(reportLabel.slice(2));
    // The stack meets the mask: worst margin +0.12 percentage points at 588 nm (found with the
    // optics engine, as design-workspace.browser.ts states), computed from the design.
    const report = (await (await page.request.get(`${baseUrl()}/api/reports/${reportId}`)).json()) as {
      hideLayers: boolean;
      summary: { source: string; pass: boolean; worstMargin: number; bands: { worstAtNm: number }[] };
    };
    expect(report.hideLayers).toBe(true);
    expect(report.summary).toMatchObject({ source: 'designed', pass: true });
    // The demo design clears R ≤ 0.5 % by about a tenth of a point (demo-seed e2e test), worst
    // somewhere inside the 420–680 nm band.
    expect(report.summary.worstMargin).toBeGreaterThan(0.05);
    expect(report.summary.worstMargin).toBeLessThan(0.2);
    const band = report.summary.bands[0]!;
    expect(band.worstAtNm).toBeGreaterThanOrEqual(420);
    expect(band.worstAtNm).toBeLessThanOrEqual(680);

    await page.getByRole('button', { name: 'Send', exact: true }).click();
    const confirm = page.getByRole('dialog', { name: `Send quote Q-${quoteId}?` });
    expect(await confirm.innerText()).toContain(
      `It goes by e-mail to ${contact} with 1 compliance report attached`,
    );
    await confirm.getByRole('button', { name: 'Send quote' }).click();
    await expect.poll(() => details.innerText(), { timeout: 30_000 }).toMatch(/Status\s+sent/);
    expect(await page.getByRole('table', { name: 'History' }).innerText()).toMatch(/sent\s+[^\n]*/);
    expect(await page.getByRole('button', { name: 'Mark accepted' }).count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Edit' }).count()).toBe(0);
    expect(pageErrors).toEqual([]);
    await context.close();

    // The admin reads the e-mail the SMTP fake received.
    const admin = await browserSession(browser, demoUser('elin.voss'));
    const adminPage = admin.page;
    await adminPage.goto(`${baseUrl()}/admin/outbox`);
    const subject = `Quote Q-${quoteId}: ${part}`;
    const row = adminPage.getByRole('grid', { name: 'Outbox' }).getByRole('row').filter({ hasText: subject });
    await row.waitFor({ timeout: 20_000 });
    expect(await row.innerText()).toContain(contact);
    expect(await row.getByRole('link', { name: `Q-${quoteId}` }).count()).toBe(1);
    await row.getByText(contact).click();
    const message = adminPage.getByRole('article', { name: `Message: ${subject}` });
    await message.waitFor();
    expect(await message.innerText()).toContain('from 100 pcs: 31.00 EUR per part');
    const link = message.getByRole('link', { name: `compliance-report-${reportId}.pdf` });
    const href = await link.getAttribute('href');
    expect(href).toMatch(/^\/api\/outbox\/\d+\/attachments\/\d+$/);
    // The browser's own session fetches the attachment behind the link.
    const file = await admin.context.request.get(`${baseUrl()}${href}`);
    expect(file.status()).toBe(200);
    expect(file.headers()['content-type']).toMatch(/^application\/pdf/);
    expect((await file.body()).subarray(0, 5).toString()).toBe('%PDF-');
    expect(admin.pageErrors).toEqual([]);
    await admin.context.close();
  });
});
