import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, demoSignIns, launchBrowser, signIn } from './browser.js';
import { browserSession, demoUser } from './demo-shop.js';

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
