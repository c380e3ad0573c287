/// <reference lib="dom" />
// Page functions passed to page.evaluate run in the browser, so this file also sees DOM types.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';
import { type ServedApp, serveForBrowser } from './served-app';

const GUIDE = resolve(import.meta.dirname, '../../docs/embedding.md');
const README = resolve(import.meta.dirname, '../../README.md');

const squash = (s: string) => s.replace(/\s+/g, ' ').trim();
/** Markdown inline syntax as a reader sees it: code, bold and links as their text. */
const plain = (s: string) =>
  squash(
    s
      .replace(/`([^`]+)`/g, '$1')
      .replace(/\*\*(.+?)\*\*/g, '$1')
      .replace(/\[([^\]]+)\]\([^)]+\)/g, '$1'),
  );
const BLOCK_START = /^(#{1,3} |```|\||- )/;

/** The guide's blocks in order, each as `kind: text` (one per table row and list item). */
function markdownBlocks(md: string): string[] {
  const lines = md.split('\n');
  const blocks: string[] = [];
  for (let i = 0; i < lines.length;) {
    const line = lines[i]!;
    if (!line.trim()) i++;
    else if (/^#{1,3} /.test(line)) {
      blocks.push(`h: ${plain(line.replace(/^#+ /, ''))}`);
      i++;
    } else if (line.startsWith('```')) {
      const code: string[] = [];
      for (i++; !lines[i]!.startsWith('```'); i++) code.push(lines[i]!);
      i++;
      blocks.push(`code: ${squash(code.join('\n'))}`);
    } else if (line.startsWith('|')) {
      for (; i < lines.length && lines[i]!.startsWith('|'); i++) {
        if (/^\|[\s|:-]+\|$/.test(lines[i]!)) continue;
        const cells = lines[i]!.trim()
          .replace(/^\||\|$/g, '')
          .split('|');
        blocks.push(`row: ${cells.map(plain).join(' | ')}`);
      }
    } else if (line.startsWith('- ')) {
      for (; i < lines.length && lines[i]!.startsWith('- '); i++) {
        blocks.push(`li: ${plain(lines[i]!.slice(2))}`);
      }
    } else {
      const para: string[] = [];
      for (; i < lines.length && lines[i]!.trim() && !BLOCK_START.test(lines[i]!); i++) {
        para.push(lines[i]!);
      }
      blocks.push(`p: ${plain(para.join(' '))}`);
    }
  }
  return blocks;
}

describe('the embedding guide at /docs/embedding', () => {
  let served: ServedApp;
  let browser: Browser;

  beforeAll(async () => {
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });

  it('says exactly what docs/embedding.md says, block by block', async () => {
    const page = await browser.newPage();
    const res = await page.goto(served.base + '/docs/embedding');
    expect(res?.status()).toBe(200);
    const shown = await page.evaluate(() => {
      const squash = (s: string) => s.replace(/\s+/g, ' ').trim();
      const out: string[] = [];
      for (const el of Array.from(document.querySelectorAll('main > *'))) {
        const tag = el.localName;
        if (/^h[1-3]$/.test(tag)) out.push(`h: ${squash(el.textContent ?? '')}`);
        else if (tag === 'p') out.push(`p: ${squash(el.textContent ?? '')}`);
        else if (tag === 'pre') out.push(`code: ${squash(el.textContent ?? '')}`);
        else if (tag === 'ul') {
          for (const li of Array.from(el.children)) out.push(`li: ${squash(li.textContent ?? '')}`);
        } else if (tag === 'table') {
          for (const tr of Array.from(el.querySelectorAll('tr'))) {
            const cells = Array.from(tr.children).map((c) => squash(c.textContent ?? ''));
            out.push(`row: ${cells.join(' | ')}`);
          }
        } else out.push(`unexpected <${tag}>`);
      }
      return out;
    });
    expect(shown).toEqual(markdownBlocks(readFileSync(GUIDE, 'utf8')));
    await page.close();
  });

  it('covers what agency developers need and names files and links that are served', async () => {
    const md = readFileSync(GUIDE, 'utf8');
    for (const heading of [
      'Angular sites',
      'Any page: custom elements',
      'Strict Content-Security-Policy',
      'Theming',
      'Locale',
      'Keys and allowed origins',
      'Quotas, and what the widgets show when refused',
      'Accessibility',
      'Storybook',
    ]) {
      expect(md).toContain(`## ${heading}\n`);
    }
    expect(md).toContain('(/storybook/)');
    expect((await fetch(served.base + '/storybook/')).status).toBe(200);
    for (const file of ['tropline-elements.js', 'tropline-elements.css']) {
      expect(md).toContain(file);
      expect((await fetch(`${served.base}/elements/${file}`)).status).toBe(200);
    }
  });

  it('is summed up in the README, topic by topic, with links to the guide and Storybook', () => {
    const readme = readFileSync(README, 'utf8');
    const start = readme.indexOf('## Embedding the widgets\n');
    expect(start).toBeGreaterThan(0);
    const section = readme.slice(start, readme.indexOf('\n## ', start + 1));
    for (const topic of [
      '`/docs/embedding`', // the full guide
      'provideTropline({ apiUrl, apiKey })', // install and provider
      '<tropline-projection', // the custom-element snippet
      '--tropline-series-1…4', // theming
      '`locale`', // locale
      'browser key bound to their origins', // keys and allowed origins
      'origin not allowed (403)',
      'allowance used up', // quotas and what the widgets show when refused
      'says why in plain words',
      'not colour alone', // accessibility
      'the cautions are always shown',
      '[Storybook](/storybook/)',
    ]) {
      expect(section, topic).toContain(topic);
    }
  });
});
