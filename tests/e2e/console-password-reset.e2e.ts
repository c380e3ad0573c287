/// <reference lib="dom" />
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { checkpoint, consoleContext, DEMO, signIn } from './console-browser';
import { type ServedApp, serveForBrowser } from './served-app';

describe('console: password reset through the development mailbox', () => {
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

  it('an analyst who forgot the password chooses a new one and signs in with it', async () => {
    const { page, outside } = await consoleContext(browser);
    await page.goto(`${served.base}/console/sign-in`, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
    await page.getByLabel('E-mail address').fill(DEMO.analyst.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await expect.poll(() => page.getByRole('status').textContent()).toContain('on its way');
    await checkpoint(page, 'reset-01-sent');

    await page.getByRole('link', { name: 'development mailbox' }).click();
    const message = page.getByRole('option', { name: /Choose a new Tropline password/ });
    await expect
      .poll(async () => {
        await page.getByRole('button', { name: 'Check for new mail' }).click();
        return message.count();
      })
      .toBe(1);
    await message.click();
    await page.getByRole('link', { name: 'Open the password link' }).click();

    const fresh = 'otter-holt-under-alder-roots';
    await page.getByLabel('New password').fill(fresh);
    await checkpoint(page, 'reset-02-new-password');
    await page.getByRole('button', { name: 'Change the password' }).click();
    await expect
      .poll(() => page.getByRole('status').textContent())
      .toContain('Your password was changed');
    await checkpoint(page, 'reset-03-sign-in-again');

    // The old password no longer works; the new one does.
    await page.getByLabel('E-mail address').fill(DEMO.analyst.email);
    await page.getByLabel('Password').fill(DEMO.analyst.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').count()).toBe(1);
    await checkpoint(page, 'reset-04-old-password-refused');
    await signIn(page, served.base, { email: DEMO.analyst.email, password: fresh });
    expect(outside).toEqual([]);
  });
});
