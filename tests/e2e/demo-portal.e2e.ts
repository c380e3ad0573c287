/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { type ServedApp, serveForBrowser } from './served-app';

const ARTIFACTS = resolve(import.meta.dirname, '../artifacts');

/** Every URL the page asked for, and those that tried to leave the machine. */
interface RequestLog {
  all: string[];
  outside: string[];
}

function isLocal(url: string): boolean {
  const { protocol, hostname } = new URL(url);
  if (protocol === 'data:' || protocol === 'blob:') return true;
  return hostname === 'localhost' || hostname === '127.0.0.1' || hostname === '[::1]';
}

async function openPage(
  browser: Browser,
  url: string,
  beforeGoto: (page: Page) => void = () => undefined,
): Promise<{ page: Page; log: RequestLog }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const log: RequestLog = { all: [], outside: [] };
  // Refuse, and record, anything that would leave localhost.
  await context.route('**/*', async (route) => {
    const url = route.request().url();
    log.all.push(url);
    if (isLocal(url)) await route.continue();
    else {
      log.outside.push(url);
      await route.abort('blockedbyclient');
    }
  });
  const page = await context.newPage();
  beforeGoto(page);
  await page.goto(url, { waitUntil: 'networkidle' });
  return { page, log };
}

interface ProjectionAnswer {
  status: number;
  body: { series: Record<string, number[]> };
}

/** Share of a canvas's pixels that have been painted (not transparent). */
async function paintedShare(page: Page, selector: string): Promise<number> {
  const canvas = page.locator(selector).first();
  await canvas.waitFor({ state: 'visible', timeout: 60_000 });
  return canvas.evaluate((c: HTMLCanvasElement) => {
    const { data } = c.getContext('2d')!.getImageData(0, 0, c.width, c.height);
    let opaque = 0;
    for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) opaque++;
    return opaque / (c.width * c.height);
  });
}

/** Console errors and uncaught exceptions of a page. */
function collectErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  return errors;
}

describe('demo portal in Chromium', () => {
  let served: ServedApp;
  let browser: Browser;

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });

  it('draws the trajectory from the API’s numbers, in shipped fonts, all from localhost', async () => {
    let apiAnswer!: Promise<ProjectionAnswer>;
    const { page, log } = await openPage(browser, served.base + '/demo/', (p) => {
      apiAnswer = p
        .waitForResponse(
          (res) => res.url().endsWith('/api/v1/projections') && res.request().method() === 'POST',
          { timeout: 30_000 },
        )
        .then(async (res) => ({ status: res.status(), body: await res.json() }));
    });
    const answer = await apiAnswer;
    expect(answer.status).toBe(200);
    expect(Object.keys(answer.body.series)).toEqual(['algae', 'daphnia', 'perch']);

    // The chart canvas exists and has been painted.
    const chart = page.locator('tropline-trajectory-chart canvas').first();
    await chart.waitFor({ state: 'visible', timeout: 30_000 });
    const painted = await chart.evaluate((canvas: HTMLCanvasElement) => {
      const ctx = canvas.getContext('2d')!;
      const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
      let opaque = 0;
      for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) opaque++;
      return opaque / (canvas.width * canvas.height);
    });
    expect(painted).toBeGreaterThan(0.01);

    // The summary beside the chart quotes the API's last perch value.
    const perchEnd = answer.body.series['perch']!.at(-1)!;
    const expected = new Intl.NumberFormat('en', { maximumSignificantDigits: 3 }).format(perchEnd);
    await expect
      .poll(() => page.locator('tropline-trajectory-chart figcaption').textContent())
      .toContain(`ends at ${expected}`);

    // Cautions are on screen.
    await expect
      .poll(() => page.locator('tropline-caution-notice').textContent())
      .toContain('not forecasts');

    // Fonts: Roboto and the icon font are loaded, from the portal's own media folder.
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return {
        roboto: document.fonts.check('400 16px Roboto'),
        icons: document.fonts.check('24px "Material Symbols Outlined"'),
        body: getComputedStyle(document.body).fontFamily,
      };
    });
    expect(fonts.roboto).toBe(true);
    expect(fonts.icons).toBe(true);
    expect(fonts.body).toMatch(/^Roboto/);
    const fontFiles = log.all.filter((u) => /\.woff2?$/.test(u));
    expect(fontFiles.length).toBeGreaterThan(0);
    expect(fontFiles.every((u) => u.startsWith(served.base + '/demo/media/'))).toBe(true);

    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal.png'), fullPage: true });
  }, 120_000);

  it('redraws the mere when a bounded parameter changes, and refuses one outside the bounds', async () => {
    const sent: number[] = [];
    let errors: string[] = [];
    const { page, log } = await openPage(browser, served.base + '/demo/', (p) => {
      errors = collectErrors(p);
      p.on('request', (req) => {
        if (req.url().endsWith('/api/v1/projections') && req.method() === 'POST') {
          const body = req.postDataJSON() as { model: { levels: { carryingCapacity?: number }[] } };
          sent.push(body.model.levels[0]!.carryingCapacity!);
        }
      });
    });
    const caption = page.locator('tropline-trajectory-chart figcaption');
    await expect.poll(() => caption.textContent()).toContain('ends at');
    const before = await caption.textContent();
    expect(sent).toEqual([40]);

    // Only what the publisher opened is editable: two fields, each with its published range.
    const form = page.locator('tropline-parameter-form');
    await expect.poll(() => form.locator('input[matinput]').count()).toBe(2);
    const capacity = page.getByRole('spinbutton', { name: /most algae the water can hold/ });
    await expect.poll(() => form.textContent()).toContain('20 – 60');

    // Within the bounds: a new projection is asked for, answered, and drawn.
    const answered = page.waitForResponse(
      (res) =>
        res.url().endsWith('/api/v1/projections') &&
        (res.request().postDataJSON() as { model: { levels: { carryingCapacity?: number }[] } })
          .model.levels[0]!.carryingCapacity === 25,
      { timeout: 30_000 },
    );
    await capacity.fill('25');
    const res = await answered;
    expect(res.status()).toBe(200);
    const series = ((await res.json()) as ProjectionAnswer['body']).series;
    const perchEnd = new Intl.NumberFormat('en', { maximumSignificantDigits: 3 }).format(
      series['perch']!.at(-1)!,
    );
    await expect.poll(() => caption.textContent()).toContain(`ends at ${perchEnd}`);
    expect(await caption.textContent()).not.toBe(before);

    // Outside the bounds: refused on the spot with a message, and never sent.
    await capacity.fill('80');
    await capacity.press('Tab');
    const message = form.locator('mat-error');
    await expect.poll(() => message.textContent()).toContain('Must be at most 60');
    expect(await capacity.getAttribute('aria-invalid')).toBe('true');
    const back = page.waitForResponse(
      (r) =>
        r.url().endsWith('/api/v1/projections') &&
        (r.request().postDataJSON() as { model: { levels: { carryingCapacity?: number }[] } }).model
          .levels[0]!.carryingCapacity === 45,
      { timeout: 30_000 },
    );
    await capacity.fill('45');
    expect((await back).status()).toBe(200);
    expect(sent).not.toContain(80);
    expect(sent).toContain(45);

    await expect
      .poll(() => page.locator('lla-public-caution').textContent())
      .toContain('qualified biologists');
    expect(errors).toEqual([]);
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal-bounded.png'), fullPage: true });
  }, 120_000);

  it('compares the deer culls on the harvest page from the API’s comparison job', async () => {
    let errors: string[] = [];
    let submitted!: Promise<number>;
    const { page, log } = await openPage(browser, served.base + '/demo/harvest', (p) => {
      errors = collectErrors(p);
      submitted = p
        .waitForResponse(
          (r) => r.url().endsWith('/api/v1/comparisons') && r.request().method() === 'POST',
          { timeout: 30_000 },
        )
        .then((r) => r.status());
    });
    expect([200, 202]).toContain(await submitted);
    const widget = page.locator('tropline-scenario-comparison');
    await expect
      .poll(() => widget.locator('table').last().textContent(), { timeout: 60_000 })
      .toContain('Cull 15 % of deer a year');
    expect(await widget.textContent()).toContain('No wolves return');
    expect(await paintedShare(page, 'tropline-scenario-comparison canvas')).toBeGreaterThan(0.01);
    await expect
      .poll(() => widget.locator('tropline-caution-notice').textContent())
      .toContain('not forecasts');
    expect(await page.locator('h1').textContent()).toContain('Hobcairn Moor');
    expect(await page.locator('lla-public-caution').textContent()).toContain('culls');
    expect(errors).toEqual([]);
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal-harvest.png'), fullPage: true });
  }, 120_000);

  it('shows the mere’s long-run regime and its bifurcation diagram from the API', async () => {
    let errors: string[] = [];
    const { page, log } = await openPage(browser, served.base + '/demo/long-run', (p) => {
      errors = collectErrors(p);
    });
    const summary = page.locator('tropline-regime-summary');
    // The lake's groups are the benchmark's at b1 = 3: chaotic, with a predictability horizon.
    await expect
      .poll(() => summary.locator('[data-regime]').getAttribute('data-regime'), { timeout: 60_000 })
      .toBe('chaotic');
    expect(await summary.textContent()).toContain('Predictability horizon');
    await expect
      .poll(() => page.locator('tropline-bifurcation-chart figcaption').textContent(), {
        timeout: 60_000,
      })
      .toMatch(/\d/);
    expect(await paintedShare(page, 'tropline-bifurcation-chart canvas')).toBeGreaterThan(0.01);
    expect(await page.locator('lla-public-caution').textContent()).toContain(
      'predictability horizon',
    );
    expect(await summary.locator('tropline-caution-notice').textContent()).toContain(
      'not forecasts',
    );
    expect(errors).toEqual([]);
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal-long-run.png'), fullPage: true });
  }, 150_000);

  it('serves the console in Tropline’s theme, reporting the API as up', async () => {
    const { page, log } = await openPage(browser, served.base + '/console/status');
    await expect.poll(() => page.locator('tc-status-page').textContent()).toContain('is answering');
    const toolbar = await page
      .locator('mat-toolbar')
      .evaluate((el) => getComputedStyle(el).backgroundColor);
    // Tropline primary (#1b6a5e in the generated palette's tone 40).
    expect(toolbar).toBe('rgb(27, 106, 94)');
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'console.png'), fullPage: true });
  }, 60_000);

  it('serves Storybook with the trajectory chart story drawn', async () => {
    const storyUrl =
      served.base +
      '/storybook/iframe.html?id=widgets-trajectory-chart--invented-lake&viewMode=story';
    const { page, log } = await openPage(browser, storyUrl);
    const canvas = page.locator('tropline-trajectory-chart canvas').first();
    await canvas.waitFor({ state: 'visible', timeout: 30_000 });
    await expect
      .poll(() => page.locator('tropline-trajectory-chart figcaption').textContent())
      .toContain('Water flea (Daphnia pulex) ranges from');
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'storybook-trajectory-chart.png') });
  }, 60_000);
});
