/// <reference lib="dom" />
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LAKE_DEMO } from '@tropline/core';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { checkpoint, consoleContext, DEMO, openFromNav, signIn } from './console-browser';
import { type ServedApp, serveForBrowser } from './served-app';

describe('console: an admin issues a browser key, sees it once, revokes it', () => {
  let served: ServedApp;
  let browser: Browser;

  beforeAll(async () => {
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
  });

  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });

  it('works end to end, and the API refuses the key right after revocation', async () => {
    const { page, outside } = await consoleContext(browser);
    await page.goto(`${served.base}/console/keys`, { waitUntil: 'networkidle' });
    // Signed out: the keys page sends us to sign in first, and back afterwards.
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(page.url()).toContain('next=%2Fkeys');
    await checkpoint(page, 'keys-01-sign-in');

    await signIn(page, served.base, DEMO.admin);
    await expect.poll(() => page.locator('tc-root mat-toolbar').textContent()).toContain('Admin');
    await checkpoint(page, 'keys-02-overview-admin');

    await openFromNav(page, 'API keys');
    await page.getByRole('table', { name: 'API keys' }).waitFor();
    await checkpoint(page, 'keys-03-list');

    // Issue a browser key; a wrong origin is caught in the form first.
    await page.getByRole('button', { name: 'Issue key' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Public portal (test)');
    await dialog.getByLabel('Allowed origins').fill('portal.example/path');
    await dialog.getByRole('button', { name: 'Issue key' }).click();
    await expect
      .poll(() => dialog.getByRole('alert').first().textContent())
      .toContain('Not an origin');
    await checkpoint(page, 'keys-04-issue-form-problem');
    await dialog.getByLabel('Allowed origins').fill(served.base);
    await dialog.getByRole('button', { name: 'Issue key' }).click();

    // The full key, once, with the warning and a copy button.
    const secret = page.getByRole('dialog', { name: 'Copy your new key now' });
    await secret.waitFor();
    const token = await secret.getByRole('textbox').inputValue();
    expect(token).toMatch(/^tropline_bk_/);
    expect(await secret.textContent()).toContain('only time the full key is shown');
    await checkpoint(page, 'keys-05-shown-once');

    // The key works from its origin before revocation.
    const call = (key: string) =>
      page.evaluate(
        async ({ key, model }) => {
          const res = await fetch('/api/v1/equilibria', {
            method: 'POST',
            headers: { Authorization: `Bearer ${key}`, 'Content-Type': 'application/json' },
            body: JSON.stringify({ model }),
          });
          return res.status;
        },
        { key, model: LAKE_DEMO.model },
      );
    expect(await call(token)).toBe(200);

    await secret.getByRole('button', { name: 'I have stored it' }).click();
    const row = page.getByRole('row', { name: /Public portal \(test\)/ });
    await expect.poll(() => row.textContent()).toContain('Active');
    expect(await row.textContent()).toContain(served.base);
    // Never shown again: the table holds only the prefix.
    expect(await page.locator('tc-keys-page').textContent()).not.toContain(token);

    // Filtering finds it; revoking asks first.
    await page.getByLabel('Search keys').fill('portal (test)');
    await expect.poll(() => page.getByRole('row').count()).toBe(2);
    await row.getByRole('button', { name: 'Revoke Public portal (test)' }).click();
    const confirm = page.getByRole('dialog', { name: /Revoke “Public portal \(test\)”/ });
    await checkpoint(page, 'keys-06-revoke-confirm');
    await confirm.getByRole('button', { name: 'Revoke key' }).click();
    await expect.poll(() => row.textContent()).toContain('Revoked');
    await checkpoint(page, 'keys-07-revoked');

    // The very next request with the key is refused.
    expect(await call(token)).toBe(401);
    expect(outside).toEqual([]);
  });
});
