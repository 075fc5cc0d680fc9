import type { AuditEventView, UserView } from '@quietglass/shared';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser } from './browser.js';
import { apiJson, apiSession, browserSession, demoUser } from './demo-shop.js';

/*
 * The demo administrator Elin Voss manages accounts on the Users page. The account she changes is
 * made for the test (an operator), so the demo staff other tests sign in as keep their roles and
 * sessions. Every change, the undo included, goes through PATCH /api/users/:id and lands on the
 * audit trail.
 */

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

function roleOf(page: Page, email: string) {
  return page.getByRole('grid', { name: 'Users' }).getByLabel(`Role of ${email}`);
}

async function openUsers(page: Page): Promise<void> {
  await page.goto(`${baseUrl()}/admin/users`);
  await page.getByRole('heading', { level: 1, name: 'Users' }).waitFor();
}

describe('user administration', () => {
  it('changes a role through the confirm dialog, keeps it after a reload, and Undo puts the old one back', async () => {
    const admin = demoUser('elin.voss');
    const api = await apiSession(admin);
    const stamp = Date.now();
    const account = await apiJson<UserView>(api, 'post', '/api/users', {
      email: `rota.${stamp}@larkspur.example`,
      displayName: `Rota Lindqvist ${stamp % 10000}`,
      role: 'operator',
      password: 'quartz-lantern-81',
    });
    const { context, page, pageErrors } = await browserSession(browser, admin);
    await openUsers(page);
    const select = roleOf(page, account.email);
    expect(await select.inputValue()).toBe('operator');

    // Operator → Sales: asked first, then reported by name and new role.
    await select.selectOption('sales');
    const ask = page.getByRole('dialog', { name: `Change ${account.displayName}'s role to Sales?` });
    await ask.getByRole('button', { name: 'Make Sales' }).click();
    const done = page.getByRole('alert').filter({ hasText: `${account.displayName} is now Sales` });
    await done.waitFor();
    expect(await done.getByRole('button', { name: 'Undo' }).count()).toBe(1);
    await page.reload();
    await roleOf(page, account.email).waitFor();
    expect(await roleOf(page, account.email).inputValue()).toBe('sales');

    // Sales → Engineer, then Undo from the snackbar: Sales again, and still so after a reload.
    await roleOf(page, account.email).selectOption('engineer');
    await page
      .getByRole('dialog', { name: `Change ${account.displayName}'s role to Engineer?` })
      .getByRole('button', { name: 'Make Engineer' })
      .click();
    await page
      .getByRole('alert')
      .filter({ hasText: `${account.displayName} is now Engineer` })
      .getByRole('button', { name: 'Undo' })
      .click();
    await page
      .getByRole('alert')
      .filter({ hasText: `${account.displayName} is now Sales` })
      .waitFor();
    await page.reload();
    await roleOf(page, account.email).waitFor();
    expect(await roleOf(page, account.email).inputValue()).toBe('sales');

    // The undo is a change like the others on the audit trail, by the admin who pressed it.
    const trail = await apiJson<AuditEventView[]>(
      api,
      'get',
      `/api/audit?entity=user&entityId=${account.id}`,
    );
    const roleChanges = trail
      .filter((e) => e.action === 'role changed')
      .sort((a, b) => a.id - b.id)
      .map((e) => ({ ...e.details, by: e.actor?.displayName }));
    expect(roleChanges).toEqual([
      { field: 'role', from: 'operator', to: 'sales', by: 'Elin Voss' },
      { field: 'role', from: 'sales', to: 'engineer', by: 'Elin Voss' },
      { field: 'role', from: 'engineer', to: 'sales', by: 'Elin Voss' },
    ]);
    expect(pageErrors).toEqual([]);
    await api.dispose();
    await context.close();
  });

  it('does not offer an administrator to deactivate themselves, and the API refuses it with a reason', async () => {
    const admin = demoUser('elin.voss');
    const { context, page, pageErrors } = await browserSession(browser, admin);
    await openUsers(page);
    const own = page
      .getByRole('grid', { name: 'Users' })
      .getByRole('switch', { name: `Active: ${admin.email}` });
    await own.waitFor();
    expect(await own.isDisabled()).toBe(true);
    expect(await own.isChecked()).toBe(true);
    expect(await own.getAttribute('title')).toBe(
      'Your own role and active flag can only be changed by another administrator.',
    );

    const api = await apiSession(admin);
    const me = (await apiJson<UserView[]>(api, 'get', '/api/users')).find((u) => u.email === admin.email)!;
    const refused = await api.patch(`/api/users/${me.id}`, { data: { active: false, version: me.version } });
    expect(refused.status()).toBe(409);
    expect(((await refused.json()) as { message: string }).message).toBe(
      'You cannot deactivate yourself; ask another admin',
    );
    const after = (await apiJson<UserView[]>(api, 'get', '/api/users')).find((u) => u.id === me.id)!;
    expect(after.active).toBe(true);
    expect(pageErrors).toEqual([]);
    await api.dispose();
    await context.close();
  });
});
