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

/** The product served and Chromium started around the enclosing `describe` (served-app.ts). */
export { servedBrowser as servedConsole } from './served-app';

/** The accessible name of the focused element, roughly as a screen reader would say it. */
export function focusedName(page: Page): Promise<string> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return '';
    const text = (ids: string) =>
      ids
        .split(/\s+/)
        .map((id) => document.getElementById(id)?.textContent ?? '')
        .join(' ');
    const labelled = el.getAttribute('aria-labelledby');
    const input = el as HTMLInputElement;
    // Icons (ligature text) and anything hidden from assistive technology are not read out.
    const shown = () => {
      const copy = el.cloneNode(true) as HTMLElement;
      copy.querySelectorAll('mat-icon, [aria-hidden="true"]').forEach((n) => n.remove());
      return copy.textContent ?? '';
    };
    const name =
      el.getAttribute('aria-label') ??
      (labelled ? text(labelled) : null) ??
      (input.labels?.[0]?.textContent || null) ??
      shown();
    return name.replace(/\s+/g, ' ').trim();
  });
}

/**
 * Presses Tab (Shift+Tab with `back`) until the focused element's name matches, as someone
 * without a mouse would; fails when it is not reached within `max` presses.
 */
export async function tabTo(
  page: Page,
  name: string | RegExp,
  { back = false, max = 120 }: { back?: boolean; max?: number } = {},
): Promise<void> {
  const seen: string[] = [];
  for (let i = 0; i < max; i++) {
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
    const now = await focusedName(page);
    if (typeof name === 'string' ? now === name : name.test(now)) return;
    seen.push(now);
  }
  throw new Error(`Tab never reached ${String(name)}; passed ${seen.join(' | ')}`);
}

/**
 * Expects the focused element to show where the focus is: the browser counts it as keyboard
 * focus (`:focus-visible`) and it, or the Material control drawing it, has a visible outline.
 */
export async function expectFocusVisible(page: Page, where: string): Promise<void> {
  const why = await page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return 'nothing has the focus';
    if (!el.matches(':focus-visible')) return `${el.tagName} is focused but not :focus-visible`;
    const ringed = (e: Element | null) => {
      if (!e) return false;
      const s = getComputedStyle(e);
      return s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) >= 2;
    };
    const field = el.closest('.mat-mdc-form-field');
    if (field)
      return field.classList.contains('mat-focused') ? '' : 'form field not marked focused';
    // Material draws these controls' ring on the control, around the focused native element.
    const drawn = el.closest(
      '.mat-mdc-checkbox, .mat-mdc-radio-button, mat-button-toggle, mat-slider',
    );
    return ringed(el) || ringed(drawn)
      ? ''
      : `${el.tagName} "${el.textContent}" has no visible ring`;
  });
  expect(why, `focus visible: ${where}`).toBe('');
}

/** Expects the focus to be inside the open dialog. */
export async function expectFocusInDialog(page: Page, where: string): Promise<void> {
  // The dialog takes the focus once it has opened (after its animation).
  await expect
    .poll(
      () =>
        page.evaluate(
          () => !!document.activeElement?.closest('mat-dialog-container, [role="dialog"]'),
        ),
      { message: `focus inside the dialog: ${where}` },
    )
    .toBe(true);
}
