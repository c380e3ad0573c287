/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { localOnlyContext } from './local-only-context';
import { type ServedApp, serveForBrowser } from './served-app';

const ARTIFACTS = resolve(import.meta.dirname, '../artifacts');

/** What went wrong on a page: console errors, uncaught exceptions, CSP violations, far requests. */
interface Trouble {
  console: string[];
  violations: string[];
  outside: string[];
}

declare global {
  interface Window {
    __cspViolations?: string[];
  }
}

async function openWatched(
  browser: Browser,
  url: string,
): Promise<{ page: Page; trouble: Trouble }> {
  const { context, log } = await localOnlyContext(browser);
  const trouble: Trouble = { console: [], violations: [], outside: log.outside };
  // Installed before any of the page's scripts run, so no violation goes unheard.
  await context.addInitScript(() => {
    window.__cspViolations = [];
    document.addEventListener('securitypolicyviolation', (e) => {
      window.__cspViolations!.push(`${e.violatedDirective} ${e.blockedURI} ${e.sample}`);
    });
  });
  const page = await context.newPage();
  page.on('console', (m) => {
    if (m.type() === 'error') trouble.console.push(m.text());
    // Chromium also reports CSP refusals on the console; keep them apart from other errors.
    if (/Content Security Policy/i.test(m.text())) trouble.violations.push(m.text());
  });
  page.on('pageerror', (e) => trouble.console.push(String(e)));
  await page.goto(url, { waitUntil: 'networkidle' });
  return { page, trouble };
}

/** Pixels of a canvas within a few steps of an rgb colour. */
async function pixelsOf(page: Page, selector: string, rgb: [number, number, number]) {
  return page
    .locator(selector)
    .first()
    .evaluate((c: HTMLCanvasElement, [r, g, b]) => {
      const { data } = c.getContext('2d')!.getImageData(0, 0, c.width, c.height);
      let n = 0;
      for (let i = 0; i < data.length; i += 4) {
        const near =
          Math.abs(data[i]! - r) < 12 &&
          Math.abs(data[i + 1]! - g) < 12 &&
          Math.abs(data[i + 2]! - b) < 12;
        if (near && data[i + 3]! > 200) n++;
      }
      return n;
    }, rgb);
}

describe('custom elements on a plain HTML page in Chromium', () => {
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

  it('serves the page with a strict policy and a fresh nonce per response', async () => {
    const first = await fetch(served.base + '/demo/plain/');
    const second = await fetch(served.base + '/demo/plain/');
    expect(first.status).toBe(200);
    const policy = first.headers.get('content-security-policy')!;
    expect(policy).toContain("script-src 'self'");
    expect(policy).toMatch(/style-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}'(;|$)/);
    expect(policy).not.toContain('unsafe-inline');
    expect(policy).not.toContain('unsafe-eval');
    const nonce = /'nonce-([^']+)'/.exec(policy)![1]!;
    expect(second.headers.get('content-security-policy')).not.toContain(nonce);
    const html = await first.text();
    expect(html).toContain(`nonce="${nonce}"`);
    expect(html).not.toContain('{{');
    // No inline script at all: every <script> names a file of this site.
    const scripts = [...html.matchAll(/<script\b([^>]*)>/g)].map((m) => m[1]!);
    expect(scripts.length).toBeGreaterThan(0);
    expect(scripts.every((attrs) => /\bsrc="[^"]+"/.test(attrs))).toBe(true);
  });

  it('runs two elements with no Angular on the page, no errors and no CSP violations', async () => {
    const { page, trouble } = await openWatched(browser, served.base + '/demo/plain/');

    // Both elements are defined and upgraded; the page itself carries no Angular app: the
    // only Angular hosts are the elements (Angular marks each with its version).
    const defined = await page.evaluate(() => ({
      projection: !!customElements.get('tropline-projection'),
      comparison: !!customElements.get('tropline-comparison'),
      angularHosts: Array.from(document.querySelectorAll('[ng-version]')).map((e) => e.localName),
    }));
    expect(defined).toEqual({
      projection: true,
      comparison: true,
      angularHosts: ['tropline-projection', 'tropline-comparison'],
    });

    // The projection element draws the API's answer.
    const caption = page.locator('tropline-projection tropline-trajectory-chart figcaption');
    await expect.poll(() => caption.textContent(), { timeout: 60_000 }).toContain('ends at');
    await expect
      .poll(() => page.locator('tropline-projection tropline-caution-notice').textContent())
      .toContain('not forecasts');

    // The comparison element runs its job over the moor's published ranges and fills its table.
    const comparison = page.locator('tropline-comparison');
    await expect
      .poll(() => comparison.locator('table').last().textContent(), { timeout: 60_000 })
      .toContain('Deer mortality (culling): highest allowed (0.5)');

    // DOM events out: the page's own script counted the elements' tropline-result events.
    const status = page.locator('#lla-events');
    await expect.poll(() => status.getAttribute('data-projection')).toMatch(/^[1-9]/);
    await expect.poll(() => status.getAttribute('data-comparison')).toMatch(/^[1-9]/);

    // The widgets' own <style> elements carry the page's nonce.
    const styles = await page.evaluate(() =>
      Array.from(document.querySelectorAll('style')).map((s) => s.nonce ?? ''),
    );
    expect(styles.length).toBeGreaterThan(3);
    expect(styles.every((n) => n.length >= 16)).toBe(true);

    // Host theming through custom properties: the caution colours and the series colours.
    const caution = await page
      .locator('tropline-projection .tropline-caution-notice')
      .evaluate((el) => getComputedStyle(el).backgroundColor);
    expect(caution).toBe('rgb(230, 236, 245)');
    const rust = await pixelsOf(
      page,
      'tropline-projection tropline-trajectory-chart canvas',
      [0xb0, 0x52, 0x3a],
    );
    expect(rust).toBeGreaterThan(50);

    const violations = await page.evaluate(() => window.__cspViolations ?? []);
    expect(violations).toEqual([]);
    expect(trouble.violations).toEqual([]);
    expect(trouble.console).toEqual([]);
    expect(trouble.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'elements-plain-page.png'), fullPage: true });
  }, 150_000);

  it('runs the long-run element on the same page: regime in words and a drawn sweep', async () => {
    const { page, trouble } = await openWatched(browser, served.base + '/demo/plain/');
    // A third element, added as a CMS block would add it, with the page's own API and key.
    const kinds = await page.evaluate(
      () =>
        new Promise<string[]>((done) => {
          const el = document.createElement('tropline-long-run');
          const seen: string[] = [];
          el.addEventListener('tropline-result', (e) => {
            seen.push((e as CustomEvent<{ kind: string }>).detail.kind);
            if (seen.includes('regime') && seen.includes('sweep')) done(seen);
          });
          const onPage = document.querySelector('tropline-projection')!;
          for (const name of ['api-url', 'api-key']) {
            el.setAttribute(name, onPage.getAttribute(name)!);
          }
          el.setAttribute('scenario', 'larchmere-brackenlow-mere');
          document.querySelector('main')!.append(el);
        }),
    );
    expect(kinds).toContain('regime');
    expect(kinds).toContain('sweep');
    const longRun = page.locator('tropline-long-run');
    // The mere's groups are the benchmark's at b1 = 3 (Hastings & Powell 1991): chaotic.
    await expect
      .poll(() => longRun.locator('[data-regime]').getAttribute('data-regime'))
      .toBe('chaotic');
    await expect
      .poll(() => longRun.locator('tropline-caution-notice').textContent())
      .toContain('not forecasts');
    // Its label names the published scenario (the seeded mere's title).
    const chart = longRun.getByRole('img', {
      name: 'Long-run peaks: Brackenlow Mere plankton chain (invented)',
      exact: true,
    });
    await expect.poll(() => chart.count()).toBe(1);
    await expect
      .poll(() => longRun.locator('tropline-bifurcation-chart figcaption').textContent())
      .toMatch(/\d/);
    expect(await page.evaluate(() => window.__cspViolations ?? [])).toEqual([]);
    expect(trouble.violations).toEqual([]);
    expect(trouble.console).toEqual([]);
    expect(trouble.outside).toEqual([]);
    await longRun.screenshot({ path: resolve(ARTIFACTS, 'elements-long-run.png') });
  }, 150_000);

  it('says so, as an event and on the page, when a scenario is not published', async () => {
    const { page, trouble } = await openWatched(browser, served.base + '/demo/plain/');
    const refusal = await page.evaluate(
      () =>
        new Promise<{ status: number; title: string; text: string }>((done) => {
          const el = document.createElement('tropline-projection');
          el.addEventListener('tropline-refused', (e) => {
            const { status, title } = (e as CustomEvent<{ status: number; title: string }>).detail;
            requestAnimationFrame(() => done({ status, title, text: el.textContent ?? '' }));
          });
          // The page's own API and browser key, so the API itself answers that it is unknown.
          const onPage = document.querySelector('tropline-projection')!;
          for (const name of ['api-url', 'api-key']) {
            el.setAttribute(name, onPage.getAttribute(name)!);
          }
          el.setAttribute('scenario', 'no-such-place');
          document.querySelector('main')!.append(el);
        }),
    );
    expect(refusal.status).toBe(404);
    expect(refusal.title).toBe('No such published scenario');
    await expect
      .poll(() => page.locator('tropline-projection[scenario="no-such-place"]').textContent())
      .toContain('No published scenario is called “no-such-place”');
    expect(await page.evaluate(() => window.__cspViolations ?? [])).toEqual([]);
    expect(trouble.outside).toEqual([]);
  }, 90_000);
});
