/// <reference lib="dom" />
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticSeries, UPLAND_DEMO } from '@tropline/core';
import { writeSurveyCsv } from '../../server/datasets/write-survey-csv';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { checkpoint, consoleContext, DEMO, openFromNav, signIn } from './console-browser';
import { type ServedApp, serveForBrowser } from './served-app';

// Synthetic surveys of the Hobcairn Moor preset itself (its truth is the preset's model), so
// a calibration from the preset's values has a known answer and finishes quickly.
const SURVEY = writeSurveyCsv(
  syntheticSeries(UPLAND_DEMO.model, UPLAND_DEMO.initial, {
    times: Array.from({ length: 41 }, (_, i) => i),
    logSigma: 0.1,
    seed: 11,
    missing: 0,
  }),
);
// Line 3 has a negative count of deer and line 4 a word where wolves are counted.
const BAD_SURVEY = 'time,heather,deer,wolves\n0,300,8,0.02\n1,290,-4,0.02\n2,280,7,many\n';

describe('console: an analyst builds, calibrates and publishes a scenario', () => {
  let served: ServedApp;
  let browser: Browser;
  let goodFile: string;

  beforeAll(async () => {
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
    goodFile = join(mkdtempSync(join(tmpdir(), 'tropline-survey-')), 'hobcairn-surveys.csv');
    writeFileSync(goodFile, SURVEY);
  });

  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });

  it('from a preset to a published scenario with its embed snippet', async () => {
    const { page, outside } = await consoleContext(browser);
    await signIn(page, served.base, DEMO.analyst);
    await checkpoint(page, 'analyst-01-overview');

    await openFromNav(page, 'Scenarios');
    await page.getByRole('table', { name: 'Scenarios, newest first' }).waitFor();
    await checkpoint(page, 'analyst-02-scenarios');

    // Create from the Hobcairn Moor preset.
    await page.getByRole('link', { name: 'New scenario' }).first().click();
    await page.getByRole('heading', { level: 1, name: 'New scenario' }).waitFor();
    await page.getByRole('radio', { name: /Hobcairn Moor browsing chain/ }).check();
    await page.getByLabel('Scenario name').fill('Hobcairn Moor, wolf return 2027');
    await checkpoint(page, 'analyst-03-new-from-preset');
    await page.getByRole('button', { name: 'Create scenario' }).click();
    await page
      .getByRole('heading', { level: 1, name: 'Hobcairn Moor, wolf return 2027' })
      .waitFor();
    await page.locator('tropline-trajectory-chart canvas').first().waitFor();
    expect(await page.locator('tropline-caution-notice').textContent()).toMatch(/\S/);
    await checkpoint(page, 'analyst-04-scenario-created');

    // A bad file, dropped on the zone: each bad cell with its line and column, nothing stored.
    await page.locator('.tc-drop').evaluate((zone, text) => {
      const data = new DataTransfer();
      data.items.add(new File([text], 'hobcairn-bad.csv', { type: 'text/csv' }));
      zone.dispatchEvent(new DragEvent('drop', { dataTransfer: data, bubbles: true }));
    }, BAD_SURVEY);
    const errors = page.getByRole('table').filter({ hasText: 'nothing was stored' });
    await errors.waitFor();
    const rows = await errors.locator('tbody tr').allTextContents();
    expect(rows.length).toBe(2);
    expect(rows[0]).toMatch(/^\s*3\s*3\s*deer/);
    expect(rows[1]).toMatch(/^\s*4\s*4\s*wolves/);
    expect(await page.getByText('No monitoring data yet.').count()).toBe(1);
    await checkpoint(page, 'analyst-05-bad-csv');

    // The good file through the file picker.
    await page.locator('input[type=file]').setInputFiles(goodFile);
    await page.getByText('Stored hobcairn-surveys.csv as dataset version 1: 41 rows.').waitFor();
    await page.getByText('Points are dataset version 1.').waitFor();
    await checkpoint(page, 'analyst-06-data-uploaded');

    // Calibrate the deer's attack rate and mortality; follow the job until it finishes.
    await page.getByRole('button', { name: 'Calibrate version 1' }).click();
    await page.getByText('Calibration finished.').waitFor({ timeout: 90_000 });
    const estimates = page.getByRole('table').filter({ hasText: 'Estimates' });
    expect(await estimates.locator('tbody tr').count()).toBe(2);
    await checkpoint(page, 'analyst-07-calibrated');
    await page.getByRole('button', { name: 'Save the fitted model as a new version' }).click();
    await page.getByText('The fit is saved as version 2.').first().waitFor();

    // Publish with one public range: the wolves' mortality.
    await page
      .locator('tc-publish-panel')
      .getByRole('checkbox', { name: /Grey wolf \(Canis lupus\): mortality/ })
      .check();
    await page.getByRole('button', { name: 'Publish with 1 public range' }).click();
    await page
      .getByText(/Version 3 is published as /)
      .first()
      .waitFor();
    await page.getByRole('heading', { name: 'Embed on a page' }).waitFor();
    const snippet = await page.locator('tc-embed-snippet pre').first().textContent();
    expect(snippet).toContain('<tropline-projection');
    expect(snippet).toContain(`api-url="${served.base}/api/v1"`);
    await page.getByRole('button', { name: 'Copy the HTML snippet' }).click();
    await checkpoint(page, 'analyst-08-published');

    await openFromNav(page, 'Usage and quota');
    await page.getByRole('heading', { name: 'Where the units went' }).waitFor();
    expect(await page.locator('main').textContent()).toContain('Calibrations');
    await checkpoint(page, 'analyst-09-usage');
    expect(outside).toEqual([]);
  });
});
