/// <reference lib="dom" />
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { checkpoint, consoleContext, DEMO, openFromNav, signIn } from './console-browser';
import { type ServedApp, serveForBrowser } from './served-app';

// An invented newcomer of the invented demo authority.
const NEWCOMER = {
  email: 'elin.sedgewick@larchmere.example',
  name: 'Elin Sedgewick',
  password: 'marsh-harrier-over-reeds',
};

describe('console: members, invitations and roles', () => {
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

  it('an admin invites an analyst, who joins from the mail in the development mailbox', async () => {
    const admin = await consoleContext(browser);
    const page = admin.page;
    await signIn(page, served.base, DEMO.admin);
    await openFromNav(page, 'Members');
    await page.getByRole('table', { name: 'Members' }).waitFor();
    // An admin may not touch the owner: the owner's role is text, not a menu.
    const ownerRow = page.getByRole('row', { name: /Maren Oakhollow/ });
    expect(await ownerRow.getByRole('combobox').count()).toBe(0);
    await checkpoint(page, 'members-01-list');

    const invite = page.getByRole('region', { name: 'Invite a colleague' });
    await invite.getByLabel('E-mail address').fill(NEWCOMER.email);
    await invite.getByRole('combobox', { name: 'Role' }).click();
    await page.getByRole('option', { name: 'Analyst' }).click();
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await expect
      .poll(() => page.getByRole('table', { name: 'Pending invitations' }).textContent())
      .toContain(NEWCOMER.email);
    expect(await invite.getByRole('status').textContent()).toContain('Invitation sent');
    await checkpoint(page, 'members-02-invited');

    // The newcomer opens the development mailbox in their own browser.
    const newcomer = await consoleContext(browser);
    const mine = newcomer.page;
    await mine.goto(`${served.base}/console/mailbox`, { waitUntil: 'networkidle' });
    const message = mine.getByRole('option', { name: /Join .* on Tropline/ });
    await expect
      .poll(async () => {
        await mine.getByRole('button', { name: 'Check for new mail' }).click();
        return message.count();
      })
      .toBe(1);
    await message.click();
    await mine.frameLocator('iframe').locator('body').waitFor();
    await checkpoint(mine, 'members-03-mailbox');

    await mine.getByRole('link', { name: 'Open the invitation' }).click();
    await mine.getByRole('heading', { name: 'Accept an invitation' }).waitFor();
    await expect
      .poll(() => mine.locator('tc-invitation-page').textContent())
      .toContain('as Analyst');
    await mine.getByLabel('Your name').fill(NEWCOMER.name);
    await mine.getByLabel('Choose a password').fill(NEWCOMER.password);
    await checkpoint(mine, 'members-04-accept');
    await mine.getByRole('button', { name: /^Join / }).click();

    // Signed in as the analyst: no key or audit pages offered.
    await mine.getByRole('heading', { name: `Welcome, ${NEWCOMER.name}` }).waitFor();
    const nav = mine.getByRole('navigation', { name: 'Console pages' });
    expect(await nav.getByRole('link', { name: 'API keys' }).count()).toBe(0);
    expect(await nav.getByRole('link', { name: 'Audit trail' }).count()).toBe(0);
    await checkpoint(mine, 'members-05-analyst-overview');

    // The admin sees the new member; the invitation is no longer pending.
    await page.reload({ waitUntil: 'networkidle' });
    await expect
      .poll(() => page.getByRole('table', { name: 'Members' }).textContent())
      .toContain(NEWCOMER.name);
    expect(await page.getByText('No invitation is waiting for an answer.').count()).toBe(1);

    // A role change asks first; Cancel keeps the role shown and held.
    const role = page.getByRole('combobox', { name: `Role of ${NEWCOMER.name}` });
    await role.click();
    await page.getByRole('option', { name: 'Viewer' }).click();
    const ask = page.getByRole('dialog', { name: `Make ${NEWCOMER.name} viewer?` });
    await ask.waitFor();
    expect(await ask.textContent()).toContain('goes from analyst to viewer');
    await checkpoint(page, 'members-06-role-confirm');
    await ask.getByRole('button', { name: 'Cancel' }).click();
    await ask.waitFor({ state: 'detached' });
    await expect.poll(() => role.textContent()).toContain('Analyst');
    await role.click();
    await page.getByRole('option', { name: 'Viewer' }).click();
    await ask.getByRole('button', { name: 'Make viewer' }).click();
    await expect
      .poll(() => page.locator('tc-members-page [role="status"]').first().textContent())
      .toContain(`${NEWCOMER.name} is now viewer.`);
    await expect.poll(() => role.textContent()).toContain('Viewer');

    // The audit trail records the invitation and the join.
    await openFromNav(page, 'Audit trail');
    await page.getByRole('table', { name: /Audit events/ }).waitFor();
    const trail = await page.getByRole('table', { name: /Audit events/ }).textContent();
    expect(trail).toContain('Invited someone');
    expect(trail).toContain('Joined');
    expect(trail).toContain('Changed a role');
    await checkpoint(page, 'members-07-audit');
    expect([...admin.outside, ...newcomer.outside]).toEqual([]);
  });

  it('a viewer finds no way to change anything', async () => {
    const { page, outside } = await consoleContext(browser);
    await signIn(page, served.base, DEMO.viewer);
    const nav = page.getByRole('navigation', { name: 'Console pages' });
    const offered = await nav.locator('[matListItemTitle]').allTextContents();
    expect(offered.map((t) => t.trim())).toEqual([
      'Overview',
      'Scenarios',
      'Usage and quota',
      'Members',
      'Development mailbox',
      'Service status',
    ]);
    await checkpoint(page, 'viewer-01-overview');

    await openFromNav(page, 'Members');
    const members = page.getByRole('table', { name: 'Members' });
    await members.waitFor();
    expect(await members.getByRole('combobox').count()).toBe(0);
    expect(await page.locator('tc-members-page').getByRole('button').count()).toBe(0);
    expect(await page.getByRole('region', { name: 'Invite a colleague' }).count()).toBe(0);
    await checkpoint(page, 'viewer-02-members');

    // A scenario: read it, preview versions, compare them, but nothing to edit, run or publish.
    await openFromNav(page, 'Scenarios');
    expect(await page.getByRole('link', { name: 'New scenario' }).count()).toBe(0);
    await page
      .getByRole('link', { name: 'Hobcairn Moor browsing chain (invented)' })
      .first()
      .click();
    await page.getByRole('heading', { level: 1, name: /Hobcairn Moor/ }).waitFor();
    await page.locator('tropline-trajectory-chart canvas').first().waitFor();
    const main = page.locator('main');
    expect(await main.getByRole('link', { name: /^Edit/ }).count()).toBe(0);
    for (const part of ['tc-scenario-analyses', 'tc-dataset-uploader', 'tc-publish-panel']) {
      expect(await page.locator(part).count(), part).toBe(0);
    }
    const buttons = (await main.getByRole('button').allTextContents()).map((t) => t.trim());
    expect(buttons.filter((b) => /publish|retire|calibrat|run|upload|save|edit/i.test(b))).toEqual(
      [],
    );
    await checkpoint(page, 'viewer-03-scenario');
    const scenarioUrl = page.url();
    await page.goto(`${scenarioUrl}/edit`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'This page is not available to your role' }).waitFor();

    // Typing the address of an admin page explains instead of showing controls.
    await page.goto(`${served.base}/console/keys`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'This page is not available to your role' }).waitFor();
    expect(await page.locator('main').textContent()).toContain(
      'As viewer your role covers reading',
    );
    await checkpoint(page, 'viewer-04-not-allowed');

    // And the server agrees.
    const status = await page.evaluate(async () => {
      const session = await (await fetch('/api/v1/session')).json();
      const res = await fetch('/api/v1/invitations', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: JSON.stringify({ email: 'someone@larchmere.example', role: 'viewer' }),
      });
      return res.status;
    });
    expect(status).toBe(403);
    // Nor may a viewer run analyses on the session's compute routes (`analyses:run`).
    const compute = await page.evaluate(async () => {
      const session = await (await fetch('/api/v1/session')).json();
      const res = await fetch('/api/v1/console/compute/equilibria', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: JSON.stringify({ model: {} }),
      });
      return { status: res.status, action: (await res.json()).action };
    });
    expect(compute).toEqual({ status: 403, action: 'analyses:run' });
    expect(outside).toEqual([]);
  });
});
