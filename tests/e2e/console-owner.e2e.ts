/// <reference lib="dom" />
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { periodOf } from '../../server/quotas/quotas-service';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { checkpoint, consoleContext, DEMO, openFromNav, signIn } from './console-browser';
import { type ServedApp, serveForBrowser } from './served-app';

/** What a signed-in page's own requests get back from a console route. */
async function answer(
  page: import('playwright-core').Page,
  method: string,
  path: string,
  body?: object,
) {
  return page.evaluate(
    async ({ method, path, body }) => {
      const session = await (await fetch('/api/v1/session')).json();
      const res = await fetch(path, {
        method,
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: body ? JSON.stringify(body) : undefined,
      });
      return { status: res.status, body: await res.json().catch(() => null) };
    },
    { method, path, body },
  );
}

describe('console: the owner’s tenant and plan', () => {
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

  it('an owner sets the alert contact and moves up a plan through a confirmation', async () => {
    // This month's use so far (an invented figure): more than the smallest plan allows.
    const { db } = served.running.app.locals.tropline;
    await db('usage_counters')
      .insert({ tenant_id: DEMO_TENANT.id, period: periodOf(Date.now()), used: 30_000 })
      .onConflict(['tenant_id', 'period'])
      .merge();

    const { page, outside } = await consoleContext(browser);
    await signIn(page, served.base, DEMO.owner);
    await openFromNav(page, 'Tenant and plan');
    await page.getByRole('heading', { level: 2, name: 'Plan: Authority' }).waitFor();
    const main = page.locator('tc-tenant-page');
    expect(await main.textContent()).toContain('30,000 of 250,000 units used (12 %)');
    const offers = page.getByRole('region', { name: 'Plans on offer' }).getByRole('listitem');
    expect(await offers.locator('h3').allTextContents()).toEqual([
      'Field station',
      'Survey',
      'Authority',
      'Catchment',
    ]);
    // The smallest plan cannot hold this month's units: it says so and offers no button.
    const small = offers.filter({ hasText: 'Field station' });
    expect(await small.getByRole('button').count()).toBe(0);
    expect(await small.textContent()).toContain('already exceed its 25,000');
    expect(await offers.filter({ hasText: 'Current plan' }).locator('h3').textContent()).toBe(
      'Authority',
    );
    await checkpoint(page, 'owner-01-tenant-and-plan');

    await page.getByLabel('Contact e-mail for quota alerts').fill('quota.desk@larchmere.example');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await expect.poll(() => main.getByRole('status').first().textContent()).toBe('Saved.');

    await page.getByRole('button', { name: 'Move up to Catchment' }).click();
    const dialog = page.getByRole('dialog', { name: 'Move to Catchment?' });
    await dialog.waitFor();
    const table = await dialog.getByRole('table').textContent();
    expect(table).toContain('250,000');
    expect(table).toContain('1,000,000');
    expect(await dialog.textContent()).toContain('The 30,000 units used this month carry over');
    // The safe choice has the focus (once the dialog has opened): an unintended Enter cancels.
    const cancel = dialog.getByRole('button', { name: 'Cancel' });
    await expect.poll(() => cancel.evaluate((b) => b === document.activeElement)).toBe(true);
    await checkpoint(page, 'owner-02-confirm');
    await dialog.getByRole('button', { name: 'Move to Catchment' }).click();
    await page.getByRole('heading', { level: 2, name: 'Plan: Catchment' }).waitFor();
    expect(await main.textContent()).toContain('The tenant is now on Catchment');
    expect(await offers.filter({ hasText: 'Current plan' }).locator('h3').textContent()).toBe(
      'Catchment',
    );
    await checkpoint(page, 'owner-03-moved');

    // The server holds the new plan, this month's units carried over, one audit event.
    const usage = await answer(page, 'GET', '/api/v1/console/usage');
    expect(usage.body).toMatchObject({ used: 30_000, limit: 1_000_000, perMinute: 3000 });
    const trail = await answer(page, 'GET', '/api/v1/audit-events?action=quota.plan-change');
    expect(trail.body.events).toHaveLength(1);
    const settings = await answer(page, 'GET', '/api/v1/tenant');
    expect(settings.body.contactEmail).toBe('quota.desk@larchmere.example');
    // And refuses a plan below the month's units, naming the field.
    const below = await answer(page, 'PUT', '/api/v1/tenant/plan', { offer: 'field-station' });
    expect(below.status).toBe(409);
    expect(below.body.errors[0].pointer).toBe('/offer');
    expect(outside).toEqual([]);
  });

  it('an admin finds no tenant page, and the server refuses its routes', async () => {
    const { page, outside } = await consoleContext(browser);
    await signIn(page, served.base, DEMO.admin);
    const nav = page.getByRole('navigation', { name: 'Console pages' });
    expect(await nav.getByRole('link', { name: 'Audit trail' }).count()).toBe(1);
    expect(await nav.getByRole('link', { name: 'Tenant and plan' }).count()).toBe(0);

    await page.goto(`${served.base}/console/tenant`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'This page is not available to your role' }).waitFor();
    await checkpoint(page, 'owner-04-admin-not-allowed');

    for (const [method, path, body] of [
      ['GET', '/api/v1/tenant', undefined],
      ['PATCH', '/api/v1/tenant', { name: 'Not an owner' }],
      ['GET', '/api/v1/tenant/plan', undefined],
      ['PUT', '/api/v1/tenant/plan', { offer: 'survey' }],
    ] as const) {
      const res = await answer(page, method, path, body);
      expect(res.status, `${method} ${path}`).toBe(403);
      expect(res.body.type).toMatch(/role-forbidden$/);
    }
    expect(outside).toEqual([]);
  });
});
