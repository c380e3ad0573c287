/// <reference lib="dom" />
// Page functions passed to evaluate run in the browser, so this file also sees DOM types.
import type { Page } from 'playwright-core';

/** Share of a canvas's pixels that have been painted (not transparent). */
export async function paintedShare(page: Page, selector: string): Promise<number> {
  const canvas = page.locator(selector).first();
  await canvas.waitFor({ state: 'visible', timeout: 60_000 });
  return canvas.evaluate((c: HTMLCanvasElement) => {
    const { data } = c.getContext('2d')!.getImageData(0, 0, c.width, c.height);
    let opaque = 0;
    for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) opaque++;
    return opaque / (c.width * c.height);
  });
}

/** Console errors and uncaught exceptions of a page, as they happen. */
export function collectErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  return errors;
}

/** One theme colour of a chart's host and how many of its canvas pixels are drawn in it. */
export interface DrawnColour {
  /** The custom property, e.g. `--tropline-series-2`. */
  readonly property: string;
  /** Its value resolved at the chart's host, `rgb(…)`. */
  readonly colour: string;
  /** Canvas pixels within a small distance of it (antialiased edges fall outside). */
  readonly pixels: number;
}

/**
 * The series colours a chart's host resolves (`--tropline-series-1…4`, through a probe element
 * as any reader of the theme would) and how many pixels of the chart's canvas carry each, so a
 * test sees that a theme change really reached the drawing.
 */
export function drawnSeriesColours(page: Page, host: string): Promise<DrawnColour[]> {
  return page
    .locator(host)
    .first()
    .evaluate((el) => {
      const probe = document.createElement('span');
      el.appendChild(probe);
      const properties = [1, 2, 3, 4].map((i) => `--tropline-series-${i}`);
      const colours = properties.map((p) => {
        probe.style.color = `var(${p})`;
        return getComputedStyle(probe).color;
      });
      probe.remove();
      const rgb = colours.map((c) => (c.match(/\d+(\.\d+)?/g) ?? []).slice(0, 3).map(Number));
      const canvas = el.querySelector('canvas')!;
      const { data } = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height);
      const counts = rgb.map(() => 0);
      for (let i = 0; i < data.length; i += 4) {
        if (data[i + 3]! < 250) continue;
        rgb.forEach(([r, g, b], k) => {
          const d =
            Math.abs(data[i]! - r!) + Math.abs(data[i + 1]! - g!) + Math.abs(data[i + 2]! - b!);
          if (d <= 24) counts[k]!++;
        });
      }
      return properties.map((property, k) => ({
        property,
        colour: colours[k]!,
        pixels: counts[k]!,
      }));
    });
}
