import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, demoSignIns, launchBrowser, signIn } from './browser.js';
import {
  FOUR_LAYER_AR,
  HALDEN,
  HALDEN_MASK,
  apiJson,
  apiSession,
  browserSession,
  demoUser,
  prepareDesign,
} from './demo-shop.js';

/*
 * Sales keep the customer list: a new customer with a contact on the Customers page, another one
 * made from the spec-mask form's "New customer…" entry, an internal design target with an angle
 * range and a design margin, shown as such on the customer's records, and archiving that hides a
 * customer from the pickers. Customers and contacts are invented demo data.
 */
let browser: Browser;
const stamp = Date.now();
const firstName = `Quillon Optics ${stamp}`;
const pickedName = `Tessaly Lens Works ${stamp}`;
const maskName = `TLW-40 design target ${stamp}`;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('customers', () => {
  it('sales create a customer with a contact, another from the mask form, and see the internal target on its records', async () => {
    const { context, page, pageErrors } = await browserSession(browser, demoUser('priya.nand'));
    await page.goto(`${baseUrl()}/customers`);
    await page.getByRole('heading', { level: 1, name: 'Customers' }).waitFor();
    await page.getByRole('button', { name: 'New customer' }).click();
    const form = page.getByRole('dialog', { name: 'New customer' });
    await form.getByLabel('Name').fill(firstName);
    await form.getByRole('button', { name: 'Add contact' }).click();
    const contact = form.getByRole('group', { name: 'Contact 1' });
    await contact.getByLabel('Contact name').fill('Ona Vell');
    await contact.getByLabel('E-mail').fill('Ona@Quillon.example');
    await form.getByRole('button', { name: 'Save customer' }).click();
    await form.waitFor({ state: 'detached' });
    const row = page
      .getByRole('table', { name: 'Customers' })
      .getByRole('row')
      .filter({ hasText: firstName });
    // The API keeps e-mail addresses in lower case.
    await expect.poll(() => row.innerText()).toContain('Ona Vell <ona@quillon.example>');

    // "New customer…" in the mask form's picker: the new customer is chosen for the mask.
    await page.goto(`${baseUrl()}/spec-masks`);
    await page.getByRole('button', { name: 'New spec mask' }).click();
    const maskForm = page.getByRole('dialog', { name: 'New spec mask' });
    await maskForm.getByLabel('Customer').selectOption({ label: 'New customer…' });
    const picked = page.getByRole('dialog', { name: 'New customer' });
    await picked.getByLabel('Name').fill(pickedName);
    await picked.getByRole('button', { name: 'Save customer' }).click();
    await picked.waitFor({ state: 'detached' });
    await expect
      .poll(() => maskForm.getByLabel('Customer').locator('option:checked').innerText())
      .toBe(pickedName);
    await maskForm.getByLabel('Name').fill(maskName);
    await maskForm.getByLabel('What this mask is').selectOption('internal');
    const band = maskForm.getByRole('group', { name: 'Limit band 1' });
    await band.getByLabel('From (nm)').fill('450');
    await band.getByLabel('To (nm)').fill('650');
    await band.getByLabel('Angles given as').selectOption('range');
    await band.getByLabel('Angle from (°)').fill('0');
    await band.getByLabel('Angle to (°)').fill('20');
    await band.getByLabel('Every (°)').fill('5');
    await band.getByLabel('Limit (%)').fill('0.5');
    await band.getByLabel('Design margin').fill('0.1');
    await page.screenshot({ path: `${process.env.QG_TEST_DATA_DIR ?? '/tmp'}/customers-mask-form.png` });
    await maskForm.getByRole('button', { name: 'Save mask' }).click();
    await maskForm.waitFor({ state: 'detached' });
    const maskRow = page.getByRole('row').filter({ hasText: maskName });
    await expect.poll(() => maskRow.innerText()).toContain('Internal design target');

    await page.goto(`${baseUrl()}/customers`);
    await page.getByRole('button', { name: `Show records of ${pickedName}` }).click();
    const masks = page
      .getByRole('region', { name: `Records of ${pickedName}` })
      .getByRole('region', { name: 'Spec masks' });
    await expect
      .poll(() => masks.innerText())
      .toMatch(new RegExp(`${maskName} rev A\\s+Internal design target`));
    await page.screenshot({
      path: `${process.env.QG_TEST_DATA_DIR ?? '/tmp'}/customers-page.png`,
      fullPage: true,
    });

    // Archived: gone from the pickers, still listed on request.
    await page.getByRole('button', { name: `Archive ${firstName}` }).click();
    await page
      .getByRole('dialog', { name: `Archive ${firstName}?` })
      .getByRole('button', { name: 'Archive' })
      .click();
    await expect.poll(() => page.getByRole('button', { name: `Archive ${firstName}` }).count()).toBe(0);
    await page.getByLabel('Show archived customers').check();
    await expect.poll(() => row.innerText()).toContain('Archived');
    await page.goto(`${baseUrl()}/spec-masks`);
    await page.getByRole('button', { name: 'New spec mask' }).click();
    const options = await page
      .getByRole('dialog', { name: 'New spec mask' })
      .getByLabel('Customer')
      .locator('option')
      .allInnerTexts();
    expect(options).toContain(pickedName);
    expect(options).not.toContain(firstName);
    expect(options.at(-1)).toBe('New customer…');
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it("the report and quote forms offer the customer's specification, never the internal design target", async () => {
    const designName = `HVS-2210 target check ${stamp}`;
    const targetName = `HVS-2210 shop target ${stamp}`;
    const engineer = await apiSession(demoUser('mira.castell'));
    try {
      const customers = await apiJson<{ id: number; name: string }[]>(engineer, 'get', '/api/customers');
      const halden = customers.find((c) => c.name === HALDEN);
      await apiJson(engineer, 'post', '/api/spec-masks', {
        name: targetName,
        customerId: halden?.id,
        revision: 'T',
        kind: 'internal',
        bands: [
          { from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, margin_percent: 0.1, step_nm: 10 },
        ],
      });
    } finally {
      await engineer.dispose();
    }
    await prepareDesign(designName, FOUR_LAYER_AR, 'approved');
    const { context, page, pageErrors } = await browserSession(browser, demoUser('priya.nand'));
    const customerMask = `${HALDEN_MASK.name} rev ${HALDEN_MASK.revision}`;

    await page.goto(`${baseUrl()}/reports`);
    await page.getByRole('button', { name: 'New compliance report' }).click();
    const report = page.getByRole('dialog', { name: 'New compliance report' });
    await report.getByLabel('Design', { exact: true }).selectOption({ label: `${designName} — ${HALDEN}` });
    const reportMasks = await report.getByLabel('Spec mask').locator('option').allInnerTexts();
    expect(reportMasks).toContain(customerMask);
    expect(reportMasks.some((o) => o.includes(targetName))).toBe(false);
    await report.getByRole('button', { name: 'Cancel' }).click();

    await page.goto(`${baseUrl()}/quotes`);
    await page.getByRole('button', { name: 'New quote' }).click();
    const quote = page.getByRole('dialog', { name: 'New quote' });
    await quote.getByLabel('Customer').selectOption({ label: HALDEN });
    const quoteMasks = await quote.getByLabel('Spec mask').locator('option').allInnerTexts();
    expect(quoteMasks).toContain(customerMask);
    expect(quoteMasks.some((o) => o.includes(targetName))).toBe(false);
    expect(await quote.getByLabel('Customer').locator('option').last().innerText()).toBe('New customer…');

    // The Spec masks page says which is which.
    await page.goto(`${baseUrl()}/spec-masks`);
    await expect
      .poll(() => page.getByRole('row').filter({ hasText: targetName }).innerText())
      .toContain('Internal design target');
    expect(await page.getByRole('row').filter({ hasText: HALDEN_MASK.name }).first().innerText()).toContain(
      'Customer specification',
    );
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('an operator opening the customers page sees that the role is not permitted', async () => {
    const operator = demoSignIns().find((s) => s.role === 'operator');
    if (!operator) throw new Error('no demo operator');
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, operator);
    await page.goto(`${baseUrl()}/customers`);
    await expect.poll(() => page.getByText(/not permitted for your role/i).count()).toBeGreaterThan(0);
    expect(await page.getByRole('table', { name: 'Customers' }).count()).toBe(0);
    await context.close();
  });
});
