/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { collectErrors, paintedShare } from './chart-probes';
import { localOnlyContext, type RequestLog } from './local-only-context';
import { type ServedApp, serveForBrowser } from './served-app';

const ARTIFACTS = resolve(import.meta.dirname, '../artifacts');

async function openPage(
  browser: Browser,
  url: string,
  beforeGoto: (page: Page) => void | Promise<void> = () => undefined,
): Promise<{ page: Page; log: RequestLog }> {
  const { context, log } = await localOnlyContext(browser);
  const page = await context.newPage();
  await beforeGoto(page);
  await page.goto(url, { waitUntil: 'networkidle' });
  return { page, log };
}

/** The mere's published scenario and the route its what-ifs go through. */
const MERE = 'larchmere-brackenlow-mere';
const MERE_PROJECTIONS = `/api/v1/published-scenarios/${MERE}/projections`;

/** A what-if as the page sends it to the published route. */
interface WhatIf {
  changes: { pointer: string; value: number }[];
}

/** The algal growth rate a what-if asks for, or undefined when it leaves it published. */
function growthOf(body: WhatIf): number | undefined {
  return body.changes.find((c) => c.pointer === '/levels/0/growthRate')?.value;
}

interface ProjectionAnswer {
  status: number;
  body: { series: Record<string, number[]> };
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

  it('draws the published mere from the API’s numbers, in shipped fonts, all from localhost', async () => {
    let apiAnswer!: Promise<ProjectionAnswer>;
    let scenario!: Promise<{ status: number; body: { publicId: string; horizon: number } }>;
    const { page, log } = await openPage(browser, served.base + '/demo/', (p) => {
      scenario = p
        .waitForResponse((res) => res.url().endsWith(`/api/v1/published-scenarios/${MERE}`), {
          timeout: 30_000,
        })
        .then(async (res) => ({ status: res.status(), body: await res.json() }));
      apiAnswer = p
        .waitForResponse(
          (res) => res.url().endsWith(MERE_PROJECTIONS) && res.request().method() === 'POST',
          { timeout: 30_000 },
        )
        .then(async (res) => ({ status: res.status(), body: await res.json() }));
    });
    // The page read the published scenario, and projected it through the published route.
    const published = await scenario;
    expect(published.status).toBe(200);
    expect(published.body.publicId).toBe(MERE);
    const answer = await apiAnswer;
    expect(answer.status).toBe(200);
    expect(await page.locator('lla-home-page h2').last().textContent()).toContain(
      `The next ${published.body.horizon} weeks`,
    );
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

  it('redraws the mere when a published parameter changes, and refuses one outside its range', async () => {
    const sent: WhatIf[] = [];
    let errors: string[] = [];
    const { page, log } = await openPage(browser, served.base + '/demo/', (p) => {
      errors = collectErrors(p);
      p.on('request', (req) => {
        if (req.url().endsWith('/api/v1/projections') && req.method() === 'POST') {
          throw new Error('the home page projected through the open route');
        }
        if (req.url().endsWith(MERE_PROJECTIONS)) sent.push(req.postDataJSON() as WhatIf);
      });
    });
    const caption = page.locator('tropline-trajectory-chart figcaption');
    await expect.poll(() => caption.textContent()).toContain('ends at');
    const before = await caption.textContent();
    // The published scenario itself: no changes asked for.
    expect(sent.map((b) => b.changes)).toEqual([[]]);

    // Only what the publisher opened is editable: three fields, each with its published range.
    const form = page.locator('tropline-parameter-form');
    await expect.poll(() => form.locator('input[matinput]').count()).toBe(3);
    const growth = page.getByRole('spinbutton', { name: /Algal growth \(nutrient load\)/ });
    await expect.poll(() => form.textContent()).toContain('1 – 3');

    // Within the range: a what-if is sent to the published route, answered, and drawn.
    const answered = page.waitForResponse(
      (res) =>
        res.url().endsWith(MERE_PROJECTIONS) &&
        growthOf(res.request().postDataJSON() as WhatIf) === 2.5,
      { timeout: 30_000 },
    );
    await growth.fill('2.5');
    const res = await answered;
    expect(res.status()).toBe(200);
    const series = ((await res.json()) as ProjectionAnswer['body']).series;
    const perchEnd = new Intl.NumberFormat('en', { maximumSignificantDigits: 3 }).format(
      series['perch']!.at(-1)!,
    );
    await expect.poll(() => caption.textContent()).toContain(`ends at ${perchEnd}`);
    expect(await caption.textContent()).not.toBe(before);

    // Outside the range: refused on the spot by the form with a message, and never sent.
    await growth.fill('4');
    await growth.press('Tab');
    const message = form.locator('mat-error');
    await expect.poll(() => message.textContent()).toContain('Must be at most 3');
    expect(await growth.getAttribute('aria-invalid')).toBe('true');
    const back = page.waitForResponse(
      (r) =>
        r.url().endsWith(MERE_PROJECTIONS) &&
        growthOf(r.request().postDataJSON() as WhatIf) === 1.5,
      { timeout: 30_000 },
    );
    await growth.fill('1.5');
    expect((await back).status()).toBe(200);
    expect(sent.map(growthOf)).not.toContain(4);
    expect(sent.map(growthOf)).toContain(1.5);

    await expect
      .poll(() => page.locator('lla-public-caution').textContent())
      .toContain('qualified biologists');
    expect(errors).toEqual([]);
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal-bounded.png'), fullPage: true });
  }, 120_000);

  it('has the server refuse a value outside the published range, naming the field, and shows why', async () => {
    const { page, log } = await openPage(browser, served.base + '/demo/');
    await expect
      .poll(() => page.locator('tropline-trajectory-chart figcaption').textContent())
      .toContain('ends at');

    // The server path, past the form: the page's own browser key, from the page's origin.
    const refused = await page.evaluate(async (route) => {
      const config = (await (await fetch('runtime-config.json')).json()) as {
        apiUrl: string;
        apiKey: string;
      };
      const res = await fetch(config.apiUrl + route.slice('/api/v1'.length), {
        method: 'POST',
        headers: { Authorization: `Bearer ${config.apiKey}`, 'Content-Type': 'application/json' },
        body: JSON.stringify({ changes: [{ pointer: '/levels/0/growthRate', value: 4 }] }),
      });
      return {
        status: res.status,
        type: res.headers.get('content-type'),
        body: (await res.json()) as { errors: { pointer: string; message: string }[] },
      };
    }, MERE_PROJECTIONS);
    expect(refused.status).toBe(400);
    expect(refused.type).toContain('application/problem+json');
    expect(refused.body.errors).toEqual([
      { pointer: '/changes/0/value', message: "must be between 1 and 3, the publisher's range" },
    ]);

    // The page's own what-if, altered on its way out to ask for the same value: the server
    // refuses it and the panel says which setting and why, in the publisher's words.
    await page.route('**' + MERE_PROJECTIONS, async (route) => {
      const body = route.request().postDataJSON() as WhatIf;
      const changes = body.changes.map((c) =>
        c.pointer === '/levels/0/growthRate' ? { ...c, value: 4 } : c,
      );
      await route.continue({ postData: JSON.stringify({ ...body, changes }) });
    });
    const answer = page.waitForResponse((r) => r.url().endsWith(MERE_PROJECTIONS), {
      timeout: 30_000,
    });
    await page.getByRole('spinbutton', { name: /Algal growth \(nutrient load\)/ }).fill('2.5');
    expect((await answer).status()).toBe(400);
    const alert = page.locator('tropline-projection-panel [role="alert"]');
    await expect
      .poll(() => alert.textContent())
      .toContain("Algal growth (nutrient load): must be between 1 and 3, the publisher's range");
    expect(await alert.textContent()).toContain('/levels/0/growthRate');
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'demo-portal-refused.png'), fullPage: true });
  }, 120_000);

  it('says so on the page when the scenario it names is not published', async () => {
    let errors: string[] = [];
    const { page, log } = await openPage(browser, served.base + '/demo/', async (p) => {
      errors = collectErrors(p);
      // The page's read of its scenario is sent on to an id the server has never published.
      await p.route(`**/api/v1/published-scenarios/${MERE}`, (route) =>
        route.continue({ url: route.request().url().replace(MERE, 'larchmere-no-such-place') }),
      );
    });
    const alert = page.locator('lla-published-status [role="alert"]');
    await expect.poll(() => alert.textContent()).toContain('No such published scenario');
    expect(await alert.textContent()).toContain(`No published scenario is called “${MERE}”`);
    expect(await page.locator('tropline-projection-panel').count()).toBe(0);
    // The browser reports the 404 itself on the console; nothing else went wrong.
    expect(errors.filter((e) => !/status of 404/.test(e))).toEqual([]);
    expect(log.outside).toEqual([]);
  }, 60_000);

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
});
