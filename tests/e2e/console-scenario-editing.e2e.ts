/// <reference lib="dom" />
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { UPLAND_DEMO } from '@tropline/core';
import {
  checkpoint,
  consoleContext,
  DEMO,
  openFromNav,
  servedConsole,
  signIn,
} from './console-browser';

const SCENARIO = UPLAND_DEMO.title;

/** Opens the seeded Hobcairn Moor scenario from the list. */
async function openScenario(page: Page): Promise<void> {
  await openFromNav(page, 'Scenarios');
  await page.getByRole('link', { name: SCENARIO }).first().click();
  await page.getByRole('heading', { level: 1, name: SCENARIO }).waitFor();
}

describe('console: an analyst edits a scenario, compares versions and runs every analysis', () => {
  const { served, browser } = servedConsole();

  it('edits with the parameter form: problems beside their fields, then a new version', async () => {
    const { page, outside } = await consoleContext(browser());
    await signIn(page, served().base, DEMO.analyst);
    await openScenario(page);
    await page.getByRole('link', { name: /^Edit version 1/ }).click();
    await page.getByRole('heading', { level: 1, name: `Edit ${SCENARIO}` }).waitFor();
    await page.locator('tropline-parameter-form input[type=number]').first().waitFor();
    await checkpoint(page, 'edit-01-form');

    // A horizon past the contract's bound and no change note: both refused before sending,
    // each named in the summary, which links to its field.
    const horizon = page.getByLabel('Horizon', { exact: true });
    await horizon.fill('5000');
    await page.getByRole('button', { name: 'Save as version 2' }).press('Enter');
    const summary = page.getByRole('alert').filter({ hasText: 'things to correct' });
    await summary.waitFor();
    expect(await summary.textContent()).toContain('Change note');
    expect(await summary.textContent()).toContain('Horizon');
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.className))
      .toMatch(/tc-summary/);
    await checkpoint(page, 'edit-02-problems');
    await summary.getByRole('link', { name: /^Horizon/ }).press('Enter');
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.id))
      .toBe('tc-edit-horizon');
    // The message sits under the field, tied to it for screen readers.
    const described = await horizon.getAttribute('aria-describedby');
    const under = await page.evaluate(
      (ids) =>
        (ids ?? '')
          .split(' ')
          .map((id) => document.getElementById(id)?.textContent ?? '')
          .join(' '),
      described,
    );
    expect(under).toMatch(/Must be at most 2000/);

    // A growth rate of zero is refused (the model needs it above zero): the form says so under
    // the field, the summary names it and its link (to the field's id) puts the focus there.
    const growth = page
      .locator('tropline-parameter-form fieldset')
      .first()
      .getByRole('spinbutton', { name: /Growth rate/ });
    await growth.fill('0');
    await growth.press('Tab');
    expect(await growth.getAttribute('id')).toBe('tropline-param-levels-0-growthRate');
    expect(await growth.getAttribute('aria-invalid')).toBe('true');
    const growthNote = await page.evaluate(
      (ids) =>
        (ids ?? '')
          .split(' ')
          .map((id) => document.getElementById(id)?.textContent ?? '')
          .join(' '),
      await growth.getAttribute('aria-describedby'),
    );
    expect(growthNote).toMatch(/Must be greater than 0 per year/);
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    const link = summary.getByRole('link', {
      name: /^Heather.*Growth rate.*: Must be greater than 0 per year/,
    });
    await link.waitFor();
    await link.press('Enter');
    await expect
      .poll(() =>
        page.evaluate(() => {
          const el = document.activeElement as HTMLInputElement;
          return `${el.id} ${el.type} ${el.value}`;
        }),
      )
      .toBe('tropline-param-levels-0-growthRate number 0');
    await growth.fill('0.8');
    await growth.press('Tab');

    // Correct it, rename the wolves' level, move a start and a parameter, say why, and save.
    await horizon.fill('60');
    await page.getByLabel('Name of level 3').fill('Grey wolf (pack of the north ridge)');
    await page.getByLabel('Start of level 2').fill('9.5');
    const mortality = page
      .locator('tropline-parameter-form fieldset')
      .nth(1)
      .getByRole('spinbutton', { name: /Mortality/ });
    await mortality.fill('0.35');
    await mortality.press('Tab');
    await page.getByLabel('Change note').fill('Deer mortality from the 2026 cull returns');
    await checkpoint(page, 'edit-03-ready');
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    await page.getByRole('heading', { level: 1, name: SCENARIO }).waitFor();
    await page
      .getByText('Version 2 saved: Deer mortality from the 2026 cull returns')
      .first()
      .waitFor();
    const row = page.getByRole('row').filter({ hasText: 'Deer mortality from the 2026 cull' });
    expect(await row.count()).toBe(1);
    await checkpoint(page, 'edit-04-saved');

    // Version 2 against version 1, field by field, reached from the version history.
    await page.getByRole('link', { name: 'Compare with version 1' }).click();
    await page.getByRole('heading', { level: 1, name: /^Compare versions of/ }).waitFor();
    const table = page.getByRole('table', { name: /Version 1 against version 2/ });
    await table.waitFor();
    const changed = table.locator('tbody tr.tc-diff');
    const changedText = (await changed.allTextContents()).join('\n');
    expect(await changed.count()).toBe(4);
    expect(changedText).toMatch(/Horizon[\s\S]*60/);
    expect(changedText).toMatch(/Level 3 name[\s\S]*north ridge/);
    expect(changedText).toMatch(/Start: Red deer[\s\S]*9\.5/);
    expect(changedText).toMatch(/Mortality[\s\S]*0\.3[\s\S]*0\.35/);
    expect(await page.getByRole('status').filter({ hasText: '4 of' }).count()).toBe(1);
    await checkpoint(page, 'edit-05-compare');
    await page.getByRole('checkbox', { name: 'Show only the differences' }).check();
    // The table redraws after the change is seen: polled, not read at once.
    await expect.poll(() => table.locator('tbody tr').count()).toBe(4);
    await checkpoint(page, 'edit-06-compare-differences');
    // And their projections, with the library's comparison widget: version 1 against the two
    // numbers version 2 changed (names and units do not change a projection).
    await page.getByText('against the 2 values version 2 changed').waitFor();
    await page.getByRole('button', { name: 'Compare the projections' }).click();
    await page.locator('tropline-scenario-comparison canvas').first().waitFor({ timeout: 90_000 });
    await checkpoint(page, 'edit-06b-compare-projections');

    // Someone else saves while this edit is open: the server's conflict (pointer
    // /baseVersion, which no field holds) is shown for the whole form, with what to do.
    await page.getByRole('link', { name: '← Back to the scenario' }).click();
    await page.getByRole('link', { name: /^Edit version 2/ }).click();
    await page.getByLabel('Change note').fill('A second look at the horizon');
    const other = await page.evaluate(async () => {
      const session = await (await fetch('/api/v1/session')).json();
      const id = location.pathname.split('/').at(-2);
      const latest = await (await fetch(`/api/v1/scenarios/${id}/versions/2`)).json();
      const res = await fetch(`/api/v1/scenarios/${id}/versions`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: JSON.stringify({ ...latest.content, changeNote: 'Saved elsewhere' }),
      });
      return res.status;
    });
    expect(other).toBe(201);
    await page.getByRole('button', { name: 'Save as version 3' }).click();
    const conflict = page.getByRole('alert').filter({ hasText: 'Reload the page' });
    await conflict.waitFor();
    expect(await conflict.textContent()).toContain('Version 3 was saved after version 2');
    await checkpoint(page, 'edit-07-conflict');
    await page.getByRole('button', { name: /^Start again from the latest version/ }).click();
    await page.getByText(/You are editing version 3 \(draft\)/).waitFor();
    expect(outside).toEqual([]);
  });

  it('runs the projection, regime, sweep, ensemble and comparison with the widgets', async () => {
    const { page, outside } = await consoleContext(browser());
    await signIn(page, served().base, DEMO.analyst);
    await openScenario(page);
    const analyses = page.locator('tc-scenario-analyses');
    await analyses.waitFor();

    await analyses
      .getByRole('button', { name: 'Run the projection and regime assessment' })
      .click();
    await analyses
      .locator('tropline-regime-summary')
      .getByText(/Lyapunov exponent/)
      .first()
      .waitFor();
    await analyses.locator('tropline-phase-portrait canvas').first().waitFor();
    expect(await analyses.locator('tropline-caution-notice').first().textContent()).toMatch(/\S/);
    await checkpoint(page, 'analyses-01-long-run');

    // A short sweep of the deer's attack rate.
    const sweep = analyses.getByRole('form', { name: 'Sweep' });
    await sweep.getByLabel('Parameter to sweep').selectOption('/levels/1/attackRate');
    await sweep.getByLabel('Values').fill('9');
    await sweep.getByLabel('Transient discarded').fill('200');
    await sweep.getByLabel('Window recorded').fill('100');
    await sweep.getByRole('button', { name: 'Run the sweep' }).click();
    await analyses
      .locator('tropline-bifurcation-chart canvas')
      .first()
      .waitFor({ timeout: 90_000 });
    await checkpoint(page, 'analyses-02-sweep');

    const ensemble = analyses.getByRole('form', { name: 'Ensemble' });
    await ensemble.getByLabel('Members').fill('40');
    await ensemble.getByRole('button', { name: 'Run the ensemble' }).click();
    await analyses.getByText(/^40 members, 1 uncertain parameter/).waitFor({ timeout: 90_000 });
    await checkpoint(page, 'analyses-03-ensemble');

    const comparison = analyses.getByRole('form', { name: 'Comparison' });
    await comparison.getByRole('button', { name: 'Add an alternative' }).click();
    await comparison.getByRole('button', { name: 'Run the comparison' }).click();
    await analyses
      .locator('tropline-scenario-comparison canvas')
      .first()
      .waitFor({ timeout: 90_000 });
    await checkpoint(page, 'analyses-04-comparison');

    // The work was charged to the analyst's own meter on the usage page.
    await openFromNav(page, 'Usage and quota');
    await page.getByRole('heading', { name: 'Where the units went' }).waitFor();
    await page
      .getByText(/Priya Calder/)
      .first()
      .waitFor();
    await checkpoint(page, 'analyses-05-usage');
    expect(outside).toEqual([]);
  });
});
