import type { Browser, BrowserContext } from 'playwright-core';

/** Whether a request stays on this machine (the product must never reach out). */
export function isLocal(url: string): boolean {
  const { protocol, hostname } = new URL(url);
  if (protocol === 'data:' || protocol === 'blob:' || protocol === 'about:') return true;
  return hostname === 'localhost' || hostname === '127.0.0.1' || hostname === '[::1]';
}

/** Every URL a context asked for, and those that tried to leave the machine. */
export interface RequestLog {
  readonly all: string[];
  readonly outside: string[];
}

/**
 * A fresh browser context (own cookies) that refuses, and records, every request that would
 * leave localhost — so a test can assert the page made none.
 */
export async function localOnlyContext(
  browser: Browser,
): Promise<{ context: BrowserContext; log: RequestLog }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const log: RequestLog = { all: [], outside: [] };
  await context.route('**/*', async (route) => {
    const url = route.request().url();
    log.all.push(url);
    if (isLocal(url)) await route.continue();
    else {
      log.outside.push(url);
      await route.abort('blockedbyclient');
    }
  });
  return { context, log };
}
