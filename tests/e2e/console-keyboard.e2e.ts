/// <reference lib="dom" />
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import {
  checkpoint,
  consoleContext,
  DEMO,
  expectAccessible,
  expectFocusInDialog,
  expectFocusVisible,
  focusedName,
  openFromNav,
  servedConsole,
  signIn,
  tabTo,
} from './console-browser';

/** Tabs to a control, checks its focus is visible, and presses a key on it. */
async function press(
  page: Page,
  name: string | RegExp,
  how: 'Enter' | 'Space' | { back: true } = 'Enter',
): Promise<void> {
  const back = typeof how === 'object';
  const key = back ? 'Enter' : how;
  await tabTo(page, name, { back });
  await expectFocusVisible(page, String(name));
  await page.keyboard.press(key);
}

/** Tabs round an open dialog in both directions: the focus never leaves it. */
async function expectFocusTrapped(page: Page, where: string): Promise<void> {
  for (let i = 0; i < 12; i++) {
    await page.keyboard.press('Tab');
    await expectFocusInDialog(page, `${where}, Tab ${i + 1}`);
  }
  for (let i = 0; i < 4; i++) {
    await page.keyboard.press('Shift+Tab');
    await expectFocusInDialog(page, `${where}, Shift+Tab ${i + 1}`);
  }
}

/**
 * Waits until the opened dialog has put the focus on one of its controls (it does so when its
 * opening animation ends; before that the focus may still be on the container or behind it).
 */
async function focusOnDialogControl(page: Page, where: string): Promise<void> {
  await expect
    .poll(
      () =>
        page.evaluate(() => {
          const el = document.activeElement;
          return !!el?.closest('mat-dialog-container') && el.tagName !== 'MAT-DIALOG-CONTAINER';
        }),
      { message: `focus on a control of the dialog: ${where}` },
    )
    .toBe(true);
}

/** Waits until no dialog is open. */
async function dialogClosed(page: Page): Promise<void> {
  await expect.poll(() => page.locator('mat-dialog-container').count()).toBe(0);
}

describe('console by keyboard alone: every dialog and form, focus kept and returned', () => {
  const { served, browser } = servedConsole();

  it('issues and revokes a key, invites a colleague and cancels the invitation', async () => {
    const { page, outside } = await consoleContext(browser());
    await signIn(page, served().base, DEMO.admin);

    // The issue dialog: opened with Enter, focus trapped, Escape closes it and the focus is
    // back on the button that opened it.
    await openFromNav(page, 'API keys');
    await page.getByRole('table', { name: 'API keys' }).waitFor();
    await press(page, 'Issue key');
    await page.getByRole('dialog', { name: 'Issue an API key' }).waitFor();
    await expectFocusInDialog(page, 'issue dialog opened');
    await expectFocusTrapped(page, 'issue dialog');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await expect.poll(() => focusedName(page)).toBe('Issue key');

    // Fill it in with keys only: a browser key for one origin.
    await page.keyboard.press('Enter');
    await page.getByRole('dialog', { name: 'Issue an API key' }).waitFor();
    await focusOnDialogControl(page, 'issue dialog reopened');
    await press(page, /^Browser key/, 'Space');
    await tabTo(page, 'Name');
    await page.keyboard.type('Keyboard portal');
    await tabTo(page, 'Allowed origins');
    await expectFocusVisible(page, 'origins');
    await page.keyboard.type('https://portal.larchmere.example');
    await checkpoint(page, 'keyboard-01-issue-dialog');
    await press(page, 'Issue key');
    const secret = page.getByRole('dialog', { name: 'Copy your new key now' });
    await secret.waitFor();
    await expectFocusInDialog(page, 'secret dialog');
    await checkpoint(page, 'keyboard-02-secret');
    await press(page, 'I have stored it');
    await dialogClosed(page);
    await expect.poll(() => focusedName(page)).toBe('Issue key');

    // Revoke, asked first: the safe choice has the focus; Escape returns it to the row.
    await press(page, 'Revoke Keyboard portal');
    const confirm = page.getByRole('dialog', { name: /Revoke “Keyboard portal”/ });
    await confirm.waitFor();
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await expectFocusVisible(page, 'confirm dialog cancel');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await expect.poll(() => focusedName(page)).toBe('Revoke Keyboard portal');
    await page.keyboard.press('Enter');
    await confirm.waitFor();
    // The dialog moves the focus to Cancel once its opening animation ends: a Tab pressed
    // before that would be undone, and Enter would land on Cancel.
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await press(page, 'Revoke key');
    await dialogClosed(page);
    await page.getByText('Key “Keyboard portal” revoked.').waitFor({ state: 'attached' });
    await page
      .getByRole('row', { name: /Keyboard portal/ })
      .getByText('Revoked')
      .waitFor();
    await checkpoint(page, 'keyboard-03-revoked');

    // Invite by keyboard: address, role chosen with the arrow keys, send.
    await openFromNav(page, 'Members');
    await page.getByRole('heading', { name: 'Invite a colleague' }).waitFor();
    await tabTo(page, 'E-mail address');
    await page.keyboard.type('ines.holloway@larchmere.example');
    await tabTo(page, /^Role/);
    await expectFocusVisible(page, 'role select');
    await page.keyboard.press('Enter');
    await page.getByRole('listbox').waitFor();
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await press(page, 'Send invitation');
    await page.getByRole('status').filter({ hasText: 'ines.holloway@larchmere.example' }).waitFor();
    await press(page, 'Cancel the invitation for ines.holloway@larchmere.example');
    await page.getByRole('dialog').waitFor();
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await expect
      .poll(() => focusedName(page))
      .toBe('Cancel the invitation for ines.holloway@larchmere.example');
    await checkpoint(page, 'keyboard-04-invited');

    // Signing out on every device is asked first; Escape keeps everyone signed in.
    await press(page, 'Tobias Fenwright (Admin)', { back: true });
    await page.getByRole('menu').waitFor();
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await page.getByRole('dialog', { name: 'Sign out on every device?' }).waitFor();
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await page.getByRole('heading', { level: 1, name: 'Members' }).waitFor();
    expect(await page.evaluate(async () => (await fetch('/api/v1/session')).status)).toBe(200);
    expect(outside).toEqual([]);
  });

  it('edits, saves and publishes a scenario, retire asked first', async () => {
    const { page, outside } = await consoleContext(browser());
    await signIn(page, served().base, DEMO.admin);
    await openFromNav(page, 'Scenarios');
    await press(page, 'Brackenlow Mere plankton chain (invented)');
    await page.getByRole('heading', { level: 1, name: /Brackenlow Mere/ }).waitFor();

    // The edit form: Enter on Save with no note puts the focus on the summary, whose link
    // takes it to the field; the note typed, Enter saves.
    await press(page, /Edit version 1$/);
    await page.getByRole('heading', { level: 1, name: /^Edit Brackenlow Mere/ }).waitFor();
    await page.locator('tropline-parameter-form input[type=number]').first().waitFor();
    await press(page, 'Save as version 2');
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.className))
      .toMatch(/tc-summary/);
    await press(page, /^Change note: /);
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('tc-edit-note');
    await page.keyboard.type('Checked by keyboard');
    await checkpoint(page, 'keyboard-05-edit-form');

    // Leaving with unsaved changes asks; Escape stays, with the focus back on Cancel.
    await press(page, 'Cancel');
    await page.getByRole('dialog', { name: 'Leave without saving?' }).waitFor();
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    expect(page.url()).toMatch(/\/edit$/);
    await tabTo(page, 'Save as version 2', { back: true });
    await page.keyboard.press('Enter');
    await page.getByText('Version 2 saved: Checked by keyboard').first().waitFor();

    // Publish with two of the three public ranges: one turned off with Space.
    await press(page, /^Algal growth \(nutrient load\)/, 'Space');
    await press(page, 'Publish with 2 public ranges');
    await page
      .getByText(/Version \d is published as /)
      .first()
      .waitFor();
    await checkpoint(page, 'keyboard-06-published');
    await press(page, /^Retire published version/);
    await page.getByRole('dialog', { name: /^Retire version/ }).waitFor();
    await expect.poll(() => focusedName(page)).toBe('Cancel');
    await page.keyboard.press('Escape');
    await dialogClosed(page);
    await expect.poll(() => focusedName(page)).toMatch(/^Retire published version/);
    expect(outside).toEqual([]);
  });

  it('axe finds nothing on any page an owner can open, nor on the signed-out pages', async () => {
    const { page, outside } = await consoleContext(browser());
    const base = served().base;
    for (const path of ['sign-in', 'password-reset?token=x', 'invitation?token=x', 'status']) {
      await page.goto(`${base}/console/${path}`, { waitUntil: 'networkidle' });
      await page.locator('h1').first().waitFor();
      await expectAccessible(page, path);
    }
    await signIn(page, base, DEMO.owner);
    const nav = page.getByRole('navigation', { name: 'Console pages' });
    const pages = (await nav.locator('[matListItemTitle]').allTextContents()).map((t) => t.trim());
    expect(pages.length).toBeGreaterThan(6);
    for (const label of pages) {
      await nav.getByRole('link', { name: label }).focus();
      await page.keyboard.press('Enter');
      await page.waitForLoadState('networkidle');
      await page.locator('main h1').first().waitFor();
      await expectAccessible(page, label);
    }
    await openFromNav(page, 'Scenarios');
    await page.getByRole('link', { name: 'Hobcairn Moor browsing chain (invented)' }).click();
    await page.locator('tropline-trajectory-chart canvas').first().waitFor();
    await expectAccessible(page, 'scenario page');
    const scenario = page.url();
    for (const sub of ['edit', 'compare']) {
      await page.goto(`${scenario}/${sub}`, { waitUntil: 'networkidle' });
      await page.locator('h1').first().waitFor();
      await expectAccessible(page, `scenario ${sub}`);
    }
    await page.goto(`${base}/console/scenarios/new`, { waitUntil: 'networkidle' });
    await expectAccessible(page, 'new scenario');
    await page.goto(`${base}/console/no-such-page`, { waitUntil: 'networkidle' });
    await page.locator('h1').first().waitFor();
    await expectAccessible(page, 'not found');
    expect(outside).toEqual([]);
  });
});
