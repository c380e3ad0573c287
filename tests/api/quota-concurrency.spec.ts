import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testConfig } from '../../server/config';
import { createApp } from '../../server/create-app';
import { periodOf, QuotasService } from '../../server/quotas/quotas-service';
import { parseRateLimit } from '../../server/quotas/rate-limit-headers';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { benchmarkProjection } from './api-harness';
import { contract } from './openapi-contract';
import { startServerProcess, type ServerProcess } from './server-processes';

const LIMIT = 24; // units
const COST = 2; // a 50-time-unit benchmark projection with 51 samples
const REQUESTS = 45;

describe('quota admission across processes sharing one database file', () => {
  let file: string;
  let key: string;
  let servers: ServerProcess[] = [];

  beforeAll(async () => {
    file = join(mkdtempSync(join(tmpdir(), 'tropline-quota-')), 'shared.sqlite');
    // Migrate, seed and set the plan once, so the processes start on a ready database.
    const app = createApp(testConfig({ sqliteFile: file }));
    await app.locals.tropline.ready;
    key = app.locals.tropline.demoKeys!.serverKey;
    await new QuotasService(app.locals.tropline.db).setPlan(
      DEMO_TENANT.id,
      { monthlyUnits: LIMIT, perMinute: 10_000 },
      'test',
    );
    await app.locals.tropline.close();
    servers = await Promise.all([1, 2, 3].map(() => startServerProcess(file)));
  }, 60_000);
  afterAll(async () => {
    await Promise.all(servers.map((s) => s.stop()));
  });

  it(`admits exactly ${LIMIT} units' worth of ${REQUESTS} concurrent requests, never more`, async () => {
    const answers = await Promise.all(
      Array.from({ length: REQUESTS }, async (_, i) => {
        // Distinct bodies, so no answer comes from a cache.
        const body = benchmarkProjection(50 - i * 1e-3, 51);
        const server = servers[i % servers.length]!;
        const res = await fetch(`${server.url}/api/v1/projections`, {
          method: 'POST',
          headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' },
          body: JSON.stringify(body),
        });
        const headers: Record<string, string> = {};
        res.headers.forEach((value, name) => (headers[name] = value));
        const json = (await res.json()) as Record<string, unknown>;
        const problems = contract.check('POST', '/api/v1/projections', res.status, headers, json);
        return { status: res.status, headers, json, problems };
      }),
    );
    expect(answers.flatMap((a) => a.problems)).toEqual([]);
    const admitted = answers.filter((a) => a.status === 200);
    const refused = answers.filter((a) => a.status === 429);
    expect(admitted).toHaveLength(LIMIT / COST);
    expect(refused).toHaveLength(REQUESTS - LIMIT / COST);
    for (const r of refused) {
      expect(r.json.limit).toBe('monthly-units');
      expect(Number(r.headers['retry-after'])).toBeGreaterThan(0);
      expect(parseRateLimit(r.headers.ratelimit!)['monthly-units']!.r).toBeLessThan(COST);
    }
    // Each admission saw its own counter value: remaining units 22, 20, …, 0 exactly once.
    const remaining = admitted.map((a) => parseRateLimit(a.headers.ratelimit)['monthly-units'].r);
    expect(remaining.sort((a, b) => a - b)).toEqual(
      Array.from({ length: LIMIT / COST }, (_, i) => i * COST),
    );

    // The ledger and the counter agree with the headers.
    const app = createApp(testConfig({ sqliteFile: file }));
    await app.locals.tropline.ready;
    const quotas = new QuotasService(app.locals.tropline.db);
    const period = periodOf(Date.now());
    expect(await quotas.repository.ledgerTotal(DEMO_TENANT.id, period)).toBe(LIMIT);
    expect(await quotas.repository.used({ tenantId: DEMO_TENANT.id, period })).toBe(LIMIT);
    await app.locals.tropline.close();

    // A refusal consumed nothing and the servers still answer.
    const usage = await fetch(`${servers[0]!.url}/api/v1/usage`, {
      headers: { authorization: `Bearer ${key}` },
    });
    expect(await usage.json()).toMatchObject({ used: LIMIT, limit: LIMIT });
  });
});
