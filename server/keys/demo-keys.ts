import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import type { Knex } from 'knex';
import type { Config } from '../config';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { KeysService } from './keys-service';

/** The demo tenant's two keys, in plaintext: only ever for development and tests. */
export interface DemoKeys {
  readonly serverKey: string;
  readonly browserKey: string;
}

/** Where the demo keys are kept: beside the SQLite file (never for `:memory:`). */
export function demoKeysFile(config: Pick<Config, 'sqliteFile'>): string | undefined {
  return config.sqliteFile === ':memory:'
    ? undefined
    : resolve(dirname(config.sqliteFile), 'demo-keys.json');
}

/** The origins the demo portal is served from: the public URL and loopback on the port. */
export function demoOrigins(config: Pick<Config, 'publicUrl' | 'port'>): string[] {
  const origins = [
    new URL(config.publicUrl).origin,
    `http://localhost:${config.port}`,
    `http://127.0.0.1:${config.port}`,
  ];
  return [...new Set(origins)];
}

/**
 * Issues the demo tenant's server and browser keys right after the first-start seeds, and
 * writes their plaintext beside the database so `npm start` can print them on every start.
 * Refused in production: demo credentials there would be public knowledge.
 */
export async function issueDemoKeys(
  db: Knex,
  config: Config,
  now: () => number,
): Promise<DemoKeys> {
  if (config.nodeEnv === 'production') throw new Error('demo keys are never issued in production');
  const keys = new KeysService(db, now);
  const server = await keys.issue(
    { tenantId: DEMO_TENANT.id, kind: 'server', name: 'Demo server key' },
    'seed',
  );
  const browser = await keys.issue(
    {
      tenantId: DEMO_TENANT.id,
      kind: 'browser',
      name: 'Demo portal browser key',
      origins: demoOrigins(config),
    },
    'seed',
  );
  const demo = { serverKey: server.token, browserKey: browser.token };
  const file = demoKeysFile(config);
  if (file) writeFileSync(file, JSON.stringify(demo, null, 2) + '\n', { mode: 0o600 });
  return demo;
}

/** The demo keys written at first start, or undefined (production, `:memory:`, none yet). */
export function readDemoKeys(config: Config): DemoKeys | undefined {
  const file = demoKeysFile(config);
  if (config.nodeEnv === 'production' || !file || !existsSync(file)) return undefined;
  try {
    const parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<DemoKeys>;
    return parsed.serverKey && parsed.browserKey
      ? { serverKey: parsed.serverKey, browserKey: parsed.browserKey }
      : undefined;
  } catch {
    return undefined;
  }
}
