/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, chromium, type Locator, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { localOnlyContext, type RequestLog } from './local-only-context';
import { type ServedApp, serveForBrowser } from './served-app';

const ARTIFACTS = resolve(import.meta.dirname, '../artifacts');

/**
 * Every widget's Storybook title, the element it renders as, and the role and accessible name a
 * screen-reader user finds it by (the widgets' English strings and default labels).
 */
const WIDGETS = [
  ['Parameter form', 'tropline-parameter-form', 'form', 'Model parameters'],
  ['Trajectory chart', 'tropline-trajectory-chart', 'img', 'Trajectory of every level over time'],
  ['Phase portrait', 'tropline-phase-portrait', 'img', 'Phase portrait'],
  ['Bifurcation chart', 'tropline-bifurcation-chart', 'img', 'Bifurcation diagram'],
  ['Regime summary', 'tropline-regime-summary', 'region', 'Long-run behaviour'],
  ['Scenario comparison', 'tropline-scenario-comparison', 'img', 'Scenario comparison'],
  ['Projection panel', 'tropline-projection-panel', 'img', 'Trajectory of every level over time'],
  ['Caution notice', 'tropline-caution-notice', 'complementary', 'How to read this projection'],
  // Found by the progress bar's label while running; its other states are listed by story below.
  ['Job strip', 'tropline-job-strip', 'progressbar', 'Computing the bifurcation diagram'],
] as const;

type Role = (typeof WIDGETS)[number][2] | 'alert' | 'status';

interface Found {
  readonly role: Role;
  readonly name: string;
  /** Text the element holds, for roles named by nothing but their content (a status). */
  readonly text?: string;
}

interface Widget extends Found {
  readonly root: string;
}

const BY_TITLE = new Map<string, Widget>(
  WIDGETS.map(([title, root, role, name]) => [`Widgets/${title}`, { root, role, name }]),
);

/**
 * Stories whose widget is found by another role and name than its title's: the job strip's
 * states (the refusals from .storybook/story-states.ts, the failure from its stories file).
 */
const BY_STORY = new Map<string, Found>([
  ['widgets-job-strip--queued', { role: 'progressbar', name: 'Comparing the scenarios' }],
  ['widgets-job-strip--quota-refused', { role: 'alert', name: 'Monthly allowance used up' }],
  ['widgets-job-strip--not-accepted', { role: 'alert', name: 'The request is not valid' }],
  ['widgets-job-strip--failed', { role: 'alert', name: 'The model could not be integrated' }],
  [
    'widgets-job-strip--cancelled',
    { role: 'status', name: '', text: 'The computation was cancelled.' },
  ],
]);

/** The element a story's widget is found by, inside `root`. */
function found(root: Locator, id: string, widget: Widget): Locator {
  const f = BY_STORY.get(id) ?? widget;
  return f.text === undefined
    ? root.getByRole(f.role, { name: f.name, exact: true })
    : root.getByRole(f.role).filter({ hasText: f.text });
}

/** The parts every docs page's written description has (the stories' `docs.description`). */
const DESCRIPTION_PARTS = ['What it is for.', 'Inputs.', 'Outputs.', 'Accessibility.', 'Cautions.'];

/** One entry of Storybook's `index.json` (v5). */
interface IndexEntry {
  readonly id: string;
  readonly title: string;
  readonly name: string;
  readonly type: 'docs' | 'story';
}

/** What a page said went wrong: console errors and uncaught exceptions. */
function collectErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  return errors;
}

/** Storybook's preview channel, as its manager drives it (the preview frame's global). */
interface PreviewChannel {
  on(event: string, listener: (...args: unknown[]) => void): void;
  off(event: string, listener: (...args: unknown[]) => void): void;
  emit(event: string, payload: unknown): void;
}

/**
 * Shows one entry in Storybook's preview frame and resolves once Storybook says it is drawn:
 * the first by opening `iframe.html?id=…&viewMode=…`, the rest by asking the loaded preview to
 * switch, as the manager does when a reader picks a story (each stories file then loads and
 * computes once, instead of once per story). Resolves with the body class Storybook leaves:
 * `sb-show-main` when drawn, `sb-show-errordisplay` when rendering failed.
 */
async function showEntry(page: Page, base: string, entry: IndexEntry): Promise<string> {
  if (!page.url().includes('/storybook/iframe.html')) {
    await page.goto(`${base}/storybook/iframe.html?id=${entry.id}&viewMode=${entry.type}`);
    await page.waitForFunction(
      () => /\bsb-show-(main|errordisplay)\b/.test(document.body.className),
      undefined,
      { timeout: 60_000 },
    );
  } else {
    await page.evaluate(
      ({ id, viewMode }) =>
        new Promise<void>((done) => {
          const channel = (window as unknown as { __STORYBOOK_ADDONS_CHANNEL__: PreviewChannel })
            .__STORYBOOK_ADDONS_CHANNEL__;
          const outcomes = [
            'storyRendered',
            'docsRendered',
            'storyErrored',
            'storyThrewException',
            'storyMissing',
          ];
          const finish = (event: string) => (payload: unknown) => {
            if ((event === 'storyRendered' || event === 'docsRendered') && payload !== id) return;
            for (const [e, l] of listeners) channel.off(e, l);
            done();
          };
          const listeners = outcomes.map((e) => [e, finish(e)] as const);
          for (const [e, l] of listeners) channel.on(e, l);
          channel.emit('setCurrentStory', { storyId: id, viewMode });
        }),
      { id: entry.id, viewMode: entry.type },
    );
  }
  return page.evaluate(() => document.body.className);
}

describe('Storybook in Chromium', () => {
  let served: ServedApp;
  let browser: Browser;
  let page: Page;
  let log: RequestLog;
  let errors: string[];
  let entries: IndexEntry[];

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
    // One page for every entry, so the preview's bundles come from the browser's cache.
    const local = await localOnlyContext(browser);
    log = local.log;
    page = await local.context.newPage();
    errors = collectErrors(page);
    const index = (await (await fetch(served.base + '/storybook/index.json')).json()) as {
      entries: Record<string, IndexEntry>;
    };
    entries = Object.values(index.entries);
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });

  it('lists a docs page and stories for every widget, and nothing else', () => {
    for (const title of BY_TITLE.keys()) {
      const mine = entries.filter((e) => e.title === title);
      expect(
        mine.filter((e) => e.type === 'docs').map((e) => e.name),
        title,
      ).toEqual(['Overview']);
      expect(mine.filter((e) => e.type === 'story').length, title).toBeGreaterThan(1);
    }
    expect(entries.filter((e) => !BY_TITLE.has(e.title))).toEqual([]);
  });

  it('draws every story with its widget, found by role and name, and no console error', async () => {
    const stories = entries.filter((e) => e.type === 'story');
    for (const entry of stories) {
      const widget = BY_TITLE.get(entry.title)!;
      errors.length = 0;
      const shown = await showEntry(page, served.base, entry);
      expect(shown, entry.id).toContain('sb-show-main');
      const root = page.locator(`#storybook-root ${widget.root}`).first();
      await root.waitFor({ state: 'attached', timeout: 30_000 });
      const named = found(root, entry.id, widget);
      await expect.poll(() => named.count(), { message: entry.id, timeout: 30_000 }).toBe(1);
      expect(errors, entry.id).toEqual([]);
    }
    expect(log.outside).toEqual([]);
  }, 900_000);

  it('shows every widget’s docs page with its description and all its stories drawn', async () => {
    for (const entry of entries.filter((e) => e.type === 'docs')) {
      const widget = BY_TITLE.get(entry.title)!;
      const storyCount = entries.filter((e) => e.type === 'story' && e.title === entry.title);
      errors.length = 0;
      const shown = await showEntry(page, served.base, entry);
      expect(shown, entry.id).toContain('sb-show-main');
      const docs = page.locator('#storybook-docs');
      for (const part of DESCRIPTION_PARTS) {
        await expect.poll(() => docs.textContent(), { message: entry.id }).toContain(part);
      }
      // Every story is drawn on the page (the first twice: at the top and in the list).
      const named = docs
        .locator(widget.root)
        .getByRole(widget.role, { name: widget.name, exact: true });
      const others = storyCount.filter((s) => BY_STORY.has(s.id));
      await expect
        .poll(() => named.count(), { message: entry.id, timeout: 60_000 })
        .toBeGreaterThanOrEqual(storyCount.length - others.length);
      for (const story of others) {
        const shownThere = found(docs.locator(widget.root), story.id, widget);
        await expect
          .poll(() => shownThere.count(), { message: story.id, timeout: 60_000 })
          .toBeGreaterThanOrEqual(1);
      }
      expect(errors, entry.id).toEqual([]);
      const file = entry.title.replace('Widgets/', '').toLowerCase().replaceAll(' ', '-');
      await page.screenshot({
        path: resolve(ARTIFACTS, `storybook-docs-${file}.png`),
        fullPage: true,
      });
    }
    expect(log.outside).toEqual([]);
  }, 900_000);
});
