/// <reference lib="dom" />
import { resolve } from 'node:path';
import type { Locator } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { LAKE_DEMO, syntheticSeries } from '@tropline/core';
import { workerThreads } from '../../server/auth/keyed-api';
import { writeSurveyCsv } from '../../server/datasets/write-survey-csv';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_SCENARIOS } from '../../seeds/05-demo-scenarios';
import { longMereFit } from '../scenarios/fit-requests';
import {
  checkpoint,
  CONSOLE_ARTIFACTS,
  consoleContext,
  DEMO,
  servedConsole,
  signIn,
} from './console-browser';

// The seeded Brackenlow Mere scenario (the Hastings–Powell chain at b1 = 3 in real units, so
// chaotic) and its synthetic dataset: six years of fortnightly surveys, seed 8101.
const MERE = DEMO_SCENARIOS[0]!.id;

const shot = (panel: Locator, name: string) =>
  panel.screenshot({ path: resolve(CONSOLE_ARTIFACTS, `${name}.png`) });

describe('console: a calibration followed live, fitted in segments, and cancelled', () => {
  const app = servedConsole();

  it('shows live progress with a cancel that stops the job, and offers segments for chaos', async () => {
    const { base, running } = app.served();
    // Another (invented) tenant whose long fits hold the calibration threads, so the demo
    // tenant's own job bound is not what keeps the member's fit waiting.
    const { db } = running.app.locals.tropline;
    const other = await new TenantsService(db).create('quillmere', 'Quillmere Wetland Trust');
    const key = (
      await new KeysService(db).issue(
        { tenantId: other.id, kind: 'server', scopes: [...SERVER_SCOPES] },
        'test',
      )
    ).token;
    const api = (method: string, path: string, body?: object | FormData) =>
      fetch(`${base}/api/v1${path}`, {
        method,
        headers: {
          authorization: `Bearer ${key}`,
          ...(body instanceof FormData ? {} : { 'content-type': 'application/json' }),
        },
        ...(body ? { body: body instanceof FormData ? body : JSON.stringify(body) } : {}),
      });
    const made = await api('POST', '/scenarios', {
      name: 'Quillmere plankton (invented)',
      model: LAKE_DEMO.model,
      initial: LAKE_DEMO.initial,
      horizon: 300,
      changeNote: 'For the test',
    });
    const theirs = ((await made.json()) as { scenario: { id: string } }).scenario.id;
    const form = new FormData();
    const csv = writeSurveyCsv(
      syntheticSeries(LAKE_DEMO.model, LAKE_DEMO.initial, {
        times: Array.from({ length: 151 }, (_, i) => i * 2),
        logSigma: 0.1,
        seed: 4,
      }),
    );
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'quillmere.csv');
    expect((await api('POST', `/scenarios/${theirs}/datasets`, form)).status).toBe(201);
    const { page, outside } = await consoleContext(app.browser());
    await signIn(page, base, DEMO.analyst);
    await page.goto(`${base}/console/scenarios/${MERE}`);
    await page.getByRole('heading', { level: 1, name: /Brackenlow Mere/ }).waitFor();
    const panel = page.locator('tc-calibration-panel');
    const dataset = panel.getByRole('combobox', { name: 'Dataset' });
    await dataset.waitFor();
    expect(await dataset.textContent()).toMatch(/for scenario version 1/);

    // The whole span: the fitted chain is chaotic on six years, so the panel offers segments.
    await panel.getByRole('button', { name: 'Calibrate version 1' }).click();
    await panel.getByText('Calibration finished.').waitFor({ timeout: 90_000 });
    expect(await panel.textContent()).toMatch(/the fitted model is chaotic/);
    const segments = panel.getByRole('button', { name: /^Fit again in segments of \d+ weeks$/ });
    await segments.waitFor();
    await shot(panel, 'calibration-01-chaotic');
    await checkpoint(page, 'calibration-01-chaotic-page');

    // Every calibration thread busy with another tenant's long fit, so the member's fit waits
    // on the server whatever the machine's speed; Cancel must stop it there.
    const held: string[] = [];
    for (let i = 0; i < workerThreads(); i++) {
      const res = await api('POST', `/scenarios/${theirs}/calibrations`, longMereFit(i));
      expect(res.status).toBe(202);
      held.push(((await res.json()) as { id: string }).id);
    }
    await segments.click();
    const progress = panel.locator('tropline-job-progress');
    await progress.getByRole('progressbar').waitFor();
    await shot(panel, 'calibration-02-waiting');
    await progress.getByRole('button', { name: 'Cancel' }).click();
    await panel.getByText('Calibration cancelled; nothing was saved.').waitFor();
    await shot(panel, 'calibration-03-cancelled');
    for (const id of held) expect((await api('DELETE', `/calibrations/${id}`)).status).toBe(202);

    // Again, to the end: the bar moves with the server's events; estimates, nothing chaotic.
    await panel.getByRole('button', { name: 'Calibrate version 1' }).click();
    await panel.getByText('Calibration finished.').waitFor({ timeout: 90_000 });
    await page.evaluate(() => {
      const seen = { max: 0 };
      (window as unknown as { progressSeen: typeof seen }).progressSeen = seen;
      new MutationObserver(() => {
        const bar = document.querySelector('tc-calibration-panel [role="progressbar"]');
        seen.max = Math.max(seen.max, Number(bar?.getAttribute('aria-valuenow') ?? 0));
      }).observe(document.body, { subtree: true, childList: true, attributes: true });
    });
    await segments.click();
    await panel.getByText(/Calibration finished, in \d+ segments\./).waitFor({ timeout: 180_000 });
    const seen = await page.evaluate(
      () => (window as unknown as { progressSeen: { max: number } }).progressSeen.max,
    );
    expect(seen).toBeGreaterThan(0);
    const estimates = panel.getByRole('table').filter({ hasText: 'Estimates' });
    expect(await estimates.locator('tbody tr').count()).toBe(2);
    expect(await panel.textContent()).not.toMatch(/the fitted model is chaotic/);
    await shot(panel, 'calibration-04-segments');
    await checkpoint(page, 'calibration-04-segments-page');
    expect(outside).toEqual([]);
  });
});
