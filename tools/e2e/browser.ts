import fs from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';
import type { Role } from '@quietglass/shared';

export interface DemoSignIn {
  email: string;
  role: Role;
  password: string;
}

export function baseUrl(): string {
  const url = process.env.QG_BASE_URL;
  if (!url) throw new Error('QG_BASE_URL is not set; run the browser tests through `npm test`');
  return url;
}

export function demoSignIns(): DemoSignIn[] {
  const file = process.env.QG_DEMO_CREDENTIALS;
  if (!file) throw new Error('QG_DEMO_CREDENTIALS is not set; run the browser tests through `npm test`');
  return JSON.parse(fs.readFileSync(file, 'utf8')) as DemoSignIn[];
}

/** Debian's Chromium, headless, with no background traffic (playwright gives each launch a fresh profile). */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.QG_CHROMIUM ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

export async function signIn(page: Page, who: DemoSignIn): Promise<void> {
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // Either the navigation of a signed-in user or the sign-in page's refusal, said at once.
  const nav = page.locator('nav[aria-label="Main"]');
  const refusal = page.getByRole('alert');
  await nav.or(refusal).first().waitFor();
  if (!(await nav.isVisible()) && (await refusal.count()) > 0 && page.url().includes('/sign-in'))
    throw new Error(`sign-in of ${who.email} refused: ${await refusal.first().innerText()}`);
  await nav.waitFor();
}
