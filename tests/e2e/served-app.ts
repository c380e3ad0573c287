import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { loadConfig } from '../../server/config';
import { type RunningServer, serve } from '../../server/serve';
import { CHROMIUM_ARGS, ensureChromium } from './chromium';

/** A port the OS says is free now (the demo key's allowed origins must name the real port). */
async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

/** The whole product served as `npm start` serves it, on a fresh SQLite file. */
export interface ServedApp {
  readonly base: string;
  readonly running: RunningServer;
  stop(): Promise<void>;
}

/** Serves the built front ends and the API on a free port with a throw-away database. */
export async function serveForBrowser(): Promise<ServedApp> {
  const dir = mkdtempSync(join(tmpdir(), 'tropline-e2e-'));
  const port = await freePort();
  const config = loadConfig({
    NODE_ENV: 'development',
    PORT: String(port),
    SQLITE_FILE: join(dir, 'tropline.sqlite'),
    LOG_LEVEL: 'warn',
  });
  const running = await serve(config);
  return {
    base: `http://localhost:${running.port}`,
    running,
    stop: async () => {
      await running.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/**
 * Serves the product and starts Chromium around the enclosing `describe`, stopping both after
 * it; the getters read them inside the tests.
 */
export function servedBrowser(): { served: () => ServedApp; browser: () => Browser } {
  let served: ServedApp | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    served = await serveForBrowser();
    browser = await chromium.launch({ executablePath: ensureChromium(), args: CHROMIUM_ARGS });
  });
  afterAll(async () => {
    await browser?.close();
    await served?.stop();
  });
  return { served: () => served!, browser: () => browser! };
}
