import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { navSectionsFor, ROLES } from '@quietglass/shared';
import { baseUrl, demoSignIns, launchBrowser, signIn } from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('signing in as each demo role', () => {
  for (const role of ROLES) {
    it(`${role}: sees exactly the navigation of the role, then signs out`, async () => {
      const who = demoSignIns().find((s) => s.role === role);
      if (!who) throw new Error(`no demo ${role}`);
      const context = await browser.newContext();
      const page = await context.newPage();
      await signIn(page, who);
      const links = await page.locator('nav[aria-label="Main"] a').allInnerTexts();
      const expected = ['Home', ...navSectionsFor(role).map((s) => s.label)];
      expect(links.map((l) => l.trim())).toEqual(expected);

      await page.getByRole('button', { name: 'Account' }).click();
      await page.getByRole('menuitem', { name: 'Sign out' }).click();
      await page.waitForURL(/\/sign-in/);
      // The session is gone: the API says so, not only the page.
      const me = await page.evaluate(async () => (await fetch('/api/auth/me')).status);
      expect(me).toBe(401);
      await context.close();
    });
  }

  it('a wrong password shows the API message and stays on the sign-in page', async () => {
    const page = await browser.newPage();
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByLabel('E-mail').fill(demoSignIns()[0]!.email);
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText('Wrong e-mail or password.').count()).toBe(1);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });

  it('an operator opening the users page sees that the role is not permitted', async () => {
    const operator = demoSignIns().find((s) => s.role === 'operator');
    if (!operator) throw new Error('no demo operator');
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, operator);
    await page.goto(`${baseUrl()}/admin/users`);
    await expect.poll(() => page.getByText(/not permitted for your role/i).count()).toBeGreaterThan(0);
    expect(await page.getByRole('grid').count()).toBe(0);
    await context.close();
  });

  it('a visitor without a session is sent to the sign-in page, with nothing in the console', async () => {
    const page = await browser.newPage();
    const consoleErrors: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'error') consoleErrors.push(msg.text());
    });
    page.on('pageerror', (err) => consoleErrors.push(err.message));
    await page.goto(`${baseUrl()}/designs`);
    await page.waitForURL(/\/sign-in/);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    // Not being signed in is the normal state of this page, not a failed request.
    expect(consoleErrors).toEqual([]);
    await page.close();
  });
});
