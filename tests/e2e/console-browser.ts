/// <reference lib="dom" />
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { expect } from 'vitest';
import { localOnlyContext } from './local-only-context';

/** Where the console journeys leave their screenshots (git-ignored). */
export const CONSOLE_ARTIFACTS = resolve(import.meta.dirname, '../artifacts/console');

/** The demo sign-ins the development seeds create (public knowledge, refused in production). */
export const DEMO = {
  owner: { email: 'maren.oakhollow@larchmere.example', password: 'larchmere-owner-demo' },
  admin: { email: 'tobias.fenwright@larchmere.example', password: 'larchmere-admin-demo' },
  analyst: { email: 'priya.calder@larchmere.example', password: 'larchmere-analyst-demo' },
  viewer: { email: 'jonas.reedmere@larchmere.example', password: 'larchmere-viewer-demo' },
} as const;

/** A fresh browser context (own cookies) whose requests may not leave the machine. */
export async function consoleContext(browser: Browser): Promise<{
  context: BrowserContext;
  page: Page;
  outside: string[];
}> {
  mkdirSync(CONSOLE_ARTIFACTS, { recursive: true });
  const { context, log } = await localOnlyContext(browser);
  return { context, page: await context.newPage(), outside: log.outside };
}

/** Runs axe (WCAG 2.2 A and AA rules) on the page as it is now and expects no violation. */
export async function expectAccessible(page: Page, where: string): Promise<void> {
  // axe cannot run inside the mailbox's sandboxed frame (scripts are forbidden there by design,
  // and axe waits for the frame forever); the frame shows a received mail, not the console.
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .exclude('iframe[sandbox]')
    .analyze();
  const found = result.violations.map(
    (v) =>
      `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`,
  );
  expect(found, `axe on ${where}`).toEqual([]);
}

/** Saves a full-page screenshot as `<name>.png` and runs axe on the same state. */
export async function checkpoint(page: Page, name: string): Promise<void> {
  await page.evaluate(() => document.fonts.ready);
  await page.screenshot({ path: resolve(CONSOLE_ARTIFACTS, `${name}.png`), fullPage: true });
  await expectAccessible(page, name);
}

/** Signs in through the form with the keyboard alone, and waits for the overview. */
export async function signIn(page: Page, base: string, who: { email: string; password: string }) {
  await page.goto(`${base}/console/sign-in`, { waitUntil: 'networkidle' });
  await page.getByLabel('E-mail address').focus();
  await page.keyboard.type(who.email);
  await page.keyboard.press('Tab');
  await page.keyboard.type(who.password);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 1, name: /^Welcome, / }).waitFor();
}

/** Opens a console page from the navigation, by keyboard. */
export async function openFromNav(page: Page, label: string): Promise<void> {
  const link = page.getByRole('navigation', { name: 'Console pages' }).getByRole('link', {
    name: label,
  });
  await link.focus();
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 1, name: label }).waitFor();
}
