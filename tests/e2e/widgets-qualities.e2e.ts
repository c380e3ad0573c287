/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { collectErrors, drawnSeriesColours, paintedShare } from './chart-probes';
import { expectAccessible, expectFocusVisible, tabTo } from './console-browser';
import { localOnlyContext, type RequestLog } from './local-only-context';
import { servedBrowser } from './served-app';

// The widgets' own qualities, in Debian's Chromium against the real API: every demo page
// passes axe in light and in dark, the charts really change palette and stop animating when
// the reader asks; the projection panel works by keyboard alone; charts follow their
// container's size, from 320 px up with every drawn word inside the canvas, and draw when
// first revealed from a hidden container.

const ARTIFACTS = resolve(import.meta.dirname, '../artifacts/widgets');
const MERE = 'larchmere-brackenlow-mere';

interface DemoPage {
  readonly path: string;
  readonly name: string;
  /** The chart widgets the page shows. */
  readonly charts: readonly string[];
}

const PAGES: readonly DemoPage[] = [
  {
    path: '/demo/',
    name: 'home',
    charts: ['tropline-trajectory-chart', 'tropline-phase-portrait'],
  },
  { path: '/demo/harvest', name: 'harvest', charts: ['tropline-scenario-comparison'] },
  { path: '/demo/long-run', name: 'long-run', charts: ['tropline-bifurcation-chart'] },
];

type Media = Parameters<Page['emulateMedia']>[0];

/** A chart's stage once its real option is drawn (the frame reads the instance back then). */
const drawn = (chart: string) =>
  `${chart} .tropline-chart-figure__stage[data-animation]:not(.tropline-chart-figure__stage--loading)`;

describe('widget qualities in Chromium', () => {
  const app = servedBrowser();
  beforeAll(() => mkdirSync(ARTIFACTS, { recursive: true }));

  async function open(
    path: string,
    media: Media = {},
    setup: (page: Page) => unknown = () => undefined,
  ): Promise<{ page: Page; log: RequestLog; errors: string[]; close: () => Promise<void> }> {
    const { context, log } = await localOnlyContext(app.browser());
    const page = await context.newPage();
    await page.emulateMedia(media);
    const errors = collectErrors(page);
    await setup(page);
    await page.goto(app.served().base + path, { waitUntil: 'networkidle' });
    return { page, log, errors, close: () => context.close() };
  }

  async function waitForCharts(page: Page, charts: readonly string[]): Promise<void> {
    for (const chart of charts) {
      await page.locator(drawn(chart)).first().waitFor({ timeout: 120_000 });
    }
  }

  it('passes axe on every demo page in light and in dark, the charts switching palette and stopping their animation', async () => {
    for (const demo of PAGES) {
      const light = await open(demo.path, { colorScheme: 'light', reducedMotion: 'no-preference' });
      await waitForCharts(light.page, demo.charts);
      await expectAccessible(light.page, `${demo.name}, light`);
      const lightColours = [];
      for (const chart of demo.charts) {
        const colours = await drawnSeriesColours(light.page, chart);
        lightColours.push(colours);
        // The chart is drawn in the page's series colours.
        expect(
          colours.some((c) => c.pixels >= 30),
          `${chart} on ${demo.name} in light: ${JSON.stringify(colours)}`,
        ).toBe(true);
      }
      // Without a preference, the trajectory and the phase portrait animate their drawing.
      if (demo.name === 'home') {
        for (const chart of demo.charts) {
          expect(await light.page.locator(drawn(chart)).getAttribute('data-animation')).toBe('on');
        }
      }
      await light.page.screenshot({
        path: resolve(ARTIFACTS, `${demo.name}-light.png`),
        fullPage: true,
      });
      expect(light.errors, `console errors on ${demo.name}, light`).toEqual([]);
      expect(light.log.outside).toEqual([]);
      await light.close();

      const dark = await open(demo.path, { colorScheme: 'dark', reducedMotion: 'reduce' });
      await waitForCharts(dark.page, demo.charts);
      await expectAccessible(dark.page, `${demo.name}, dark`);
      expect(
        await dark.page.evaluate(() => getComputedStyle(document.body).backgroundColor),
      ).not.toBe('rgb(255, 255, 255)');
      for (const [i, chart] of demo.charts.entries()) {
        const colours = await drawnSeriesColours(dark.page, chart);
        const before = lightColours[i]!;
        // Each series colour is the theme's dark one now, and the canvas is drawn in them.
        colours.forEach((c, k) => expect(c.colour, c.property).not.toBe(before[k]!.colour));
        expect(
          colours.some((c) => c.pixels >= 30),
          `${chart} on ${demo.name} in dark: ${JSON.stringify(colours)}`,
        ).toBe(true);
        // Reduced motion: the drawn chart's own option says no animation.
        expect(await dark.page.locator(drawn(chart)).getAttribute('data-animation')).toBe('off');
      }
      await dark.page.screenshot({
        path: resolve(ARTIFACTS, `${demo.name}-dark.png`),
        fullPage: true,
      });
      expect(dark.errors, `console errors on ${demo.name}, dark`).toEqual([]);
      expect(dark.log.outside).toEqual([]);
      await dark.close();
    }
  }, 600_000);

  it('works by keyboard alone: every control of the projection panel in Tab order with a visible ring, sliders redraw, the table opens, the box turns', async () => {
    const open_: string[] = [];
    const bound: string[] = [];
    const { page, log, errors, close } = await open('/demo/', {}, (p) => {
      p.on('request', (req) => {
        const url = req.url();
        if (req.method() !== 'POST') return;
        if (/\/api\/v1\/(projections|regimes|equilibria)$/.test(url)) open_.push(url);
        if (url.includes(`/published-scenarios/${MERE}/`)) bound.push(url.split('/').pop()!);
      });
    });
    const caption = page.locator('tropline-trajectory-chart figcaption');
    await waitForCharts(page, ['tropline-trajectory-chart', 'tropline-phase-portrait']);

    // Every control of the panel, in document order (no positive tabindex anywhere).
    const controls = await page.evaluate(() =>
      Array.from(
        document.querySelectorAll<HTMLElement>(
          'tropline-projection-panel :is(input, button, select, textarea, [tabindex])',
        ),
      )
        .filter((el) => el.tabIndex >= 0 && !(el as HTMLButtonElement).disabled)
        .map((el, i) => {
          el.dataset['kbd'] = String(i);
          return `${el.tagName.toLowerCase()} ${el.getAttribute('aria-label') ?? el.textContent!.trim()}`;
        }),
    );
    expect(controls.length).toBeGreaterThan(15);

    // From the top of the page, Tab through the panel; each stop is keyboard focus with a ring.
    const reached: string[] = [];
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    for (let i = 0; i < 200; i++) {
      await page.keyboard.press('Tab');
      const index = await page.evaluate(
        () => (document.activeElement as HTMLElement | null)?.dataset['kbd'] ?? null,
      );
      if (index === null) {
        if (reached.length) break;
        continue;
      }
      reached.push(controls[Number(index)]!);
      await expectFocusVisible(page, controls[Number(index)]!);
    }
    expect(reached).toEqual(controls);

    // A parameter slider moves with the arrow keys, and the chart is redrawn from the answer.
    await tabTo(page, /^Algal growth/, { back: true });
    expect(
      await page.evaluate(() => document.activeElement!.matches('input[matSliderThumb]')),
    ).toBe(true);
    const before = await caption.textContent();
    const answered = page.waitForResponse(
      (r) =>
        r.url().endsWith(`/published-scenarios/${MERE}/projections`) &&
        (r.request().postDataJSON() as { changes: { pointer: string }[] }).changes.some(
          (c) => c.pointer === '/levels/0/growthRate',
        ),
      { timeout: 60_000 },
    );
    await page.keyboard.press('ArrowRight');
    expect((await answered).status()).toBe(200);
    await expect.poll(() => caption.textContent(), { timeout: 30_000 }).not.toBe(before);
    expect(await page.getByRole('spinbutton', { name: /Algal growth/ }).inputValue()).not.toBe('2');

    // The data-table view opens and closes from the keyboard.
    await tabTo(page, 'Show the numbers as a table');
    const toggle = page.locator('tropline-trajectory-chart .tropline-chart-figure__table-toggle');
    await page.keyboard.press('Enter');
    await expect.poll(() => toggle.getAttribute('aria-expanded')).toBe('true');
    const table = page.locator('tropline-trajectory-chart .tropline-chart-figure__table');
    await expect.poll(() => table.locator('tbody tr').count()).toBeGreaterThan(100);
    await page.keyboard.press('Space');
    await expect.poll(() => toggle.getAttribute('aria-expanded')).toBe('false');
    expect(await table.count()).toBe(0);

    // The three-level view: chosen with the keyboard, turned with the arrows and the slider.
    // The toggles are one Tab stop (the chosen one); the arrow keys move between them.
    await tabTo(page, 'Two levels');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Space');
    const portrait = page.locator('tropline-phase-portrait figcaption');
    await expect.poll(() => portrait.textContent()).toContain('Three-level view');
    await tabTo(page, 'Phase portrait');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowUp');
    await expect.poll(() => portrait.textContent()).toContain('turned -85° and tilted 40°');
    await page.locator('tropline-phase-portrait').screenshot({
      path: resolve(ARTIFACTS, 'phase-portrait-three-levels.png'),
    });
    await tabTo(page, 'Turn', { back: true });
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => portrait.textContent()).toContain('turned -80°');
    await expectAccessible(page, 'projection panel, three-level view');

    // Bound to the published scenario, the panel never sent a whole model to the open routes.
    expect(open_).toEqual([]);
    expect(new Set(bound)).toEqual(new Set(['projections', 'regimes', 'equilibria']));
    expect(errors).toEqual([]);
    expect(log.outside).toEqual([]);
    await page.screenshot({ path: resolve(ARTIFACTS, 'keyboard-walk.png'), fullPage: true });
    await close();
  }, 300_000);

  it('redraws a chart at its container’s new width, and works from 320 px wide with no sideways scroll', async () => {
    const { page, close } = await open('/demo/');
    await waitForCharts(page, ['tropline-trajectory-chart']);
    const panel = page.locator('tropline-projection-panel');
    const canvas = page.locator('tropline-trajectory-chart canvas').first();
    const size = () =>
      canvas.evaluate((c: HTMLCanvasElement) => ({
        css: Math.round(c.getBoundingClientRect().width),
        pixels: c.width / devicePixelRatio,
        box: Math.round(c.closest('.tropline-trajectory-chart__echarts')!.clientWidth),
      }));
    await panel.evaluate((el: HTMLElement) => (el.style.width = '900px'));
    await expect.poll(async () => (await size()).box).toBeLessThanOrEqual(900);
    await expect
      .poll(async () => {
        const s = await size();
        return s.pixels === s.box;
      })
      .toBe(true);
    const wide = await size();
    await panel.evaluate((el: HTMLElement) => (el.style.width = '360px'));
    await expect.poll(async () => (await size()).box).toBeLessThanOrEqual(360);
    // The canvas itself is redrawn at the new size, not just squeezed by CSS.
    await expect
      .poll(async () => (await size()).pixels, { timeout: 10_000 })
      .toBe((await size()).box);
    expect((await size()).pixels).toBeLessThan(wide.pixels);
    expect(await paintedShare(page, 'tropline-trajectory-chart canvas')).toBeGreaterThan(0.01);
    await panel.screenshot({ path: resolve(ARTIFACTS, 'panel-360px.png') });
    await close();

    for (const demo of PAGES) {
      const narrow = await open(demo.path, {}, (p) =>
        p.setViewportSize({ width: 320, height: 800 }),
      );
      await waitForCharts(narrow.page, demo.charts);
      const overflow = await narrow.page.evaluate(() => ({
        scroll: document.documentElement.scrollWidth,
        client: document.documentElement.clientWidth,
        wide: Array.from(document.querySelectorAll<HTMLElement>('body *'))
          .filter(
            (el) => el.getBoundingClientRect().right > document.documentElement.clientWidth + 1,
          )
          .filter((el) => !el.closest('[role="region"], .tropline-scenario-comparison__metrics'))
          .slice(0, 5)
          .map((el) => `${el.tagName.toLowerCase()}.${el.className}`),
      }));
      expect(overflow.scroll, `${demo.name} at 320 px: ${overflow.wide.join(', ')}`).toBe(
        overflow.client,
      );
      for (const chart of demo.charts) {
        expect(await paintedShare(narrow.page, `${chart} canvas`)).toBeGreaterThan(0.01);
        const stage = narrow.page.locator(`${drawn(chart)}[data-text-outside]`).first();
        await stage.screenshot({ path: resolve(ARTIFACTS, `${demo.name}-320px-${chart}.png`) });
        // Every word a chart drew lies inside its canvas: axis names (broken into lines that
        // fit), the horizon's label, titles, the legend. The frame counts the drawn texts past
        // the canvas after each drawing and names them in data-text-outside-words.
        await expect
          .poll(
            async () =>
              `${await stage.getAttribute('data-text-outside')} ${(await stage.getAttribute('data-text-outside-words')) ?? ''}`.trim(),
            {
              message: `${demo.name} at 320 px: ${chart}'s texts past its canvas`,
              timeout: 30_000,
            },
          )
          .toBe('0');
      }
      await narrow.page.screenshot({
        path: resolve(ARTIFACTS, `${demo.name}-320px.png`),
        fullPage: true,
      });
      expect(narrow.errors).toEqual([]);
      await narrow.close();
    }
  }, 400_000);

  it('draws a chart first rendered inside a hidden container once it is shown', async () => {
    const { page, errors, close } = await open('/demo/', {}, (p) =>
      // The panel's host starts hidden, as inside a closed tab.
      p.addInitScript(() =>
        document.addEventListener('DOMContentLoaded', () => {
          const style = document.createElement('style');
          style.id = 'closed-tab';
          style.textContent = 'tropline-projection-panel { display: none !important; }';
          document.head.appendChild(style);
        }),
      ),
    );
    const caption = page.locator('tropline-trajectory-chart figcaption');
    await expect.poll(() => caption.textContent(), { timeout: 60_000 }).toContain('Trajectory of');
    const canvas = page.locator('tropline-trajectory-chart canvas').first();
    await canvas.waitFor({ state: 'attached' });
    // Hidden, the chart has no size to take: it is drawn at a stand-in width.
    const hiddenWidth = await canvas.evaluate((c: HTMLCanvasElement) => c.width);
    expect(hiddenWidth).toBeLessThan(300);
    await page.evaluate(() => document.getElementById('closed-tab')!.remove());
    await expect
      .poll(
        async () => {
          const s = await canvas.evaluate((c: HTMLCanvasElement) => [
            c.width / devicePixelRatio,
            c.closest('.tropline-trajectory-chart__echarts')!.clientWidth,
          ]);
          return s[0]! > 300 && s[0] === s[1];
        },
        { timeout: 10_000 },
      )
      .toBe(true);
    expect(await paintedShare(page, 'tropline-trajectory-chart canvas')).toBeGreaterThan(0.01);
    await page.locator('tropline-projection-panel').screenshot({
      path: resolve(ARTIFACTS, 'revealed-from-hidden.png'),
    });
    expect(errors).toEqual([]);
    await close();
  }, 120_000);
});
