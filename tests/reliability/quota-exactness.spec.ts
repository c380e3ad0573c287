import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { KeysService } from '../../server/keys/keys-service';
import { OPEN_REQUESTS_PER_KEY, periodOf, QuotasService } from '../../server/quotas/quotas-service';
import { parseRateLimit } from '../../server/quotas/rate-limit-headers';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import {
  freshDatabaseFile,
  prepareDatabase,
  problemComplaints,
  send,
  spawnApi,
  type Answer,
  type LiveServer,
} from './live-server';

// tests/api/quota-concurrency.spec.ts holds one key to 45 projections; this goes wider: hundreds
// of requests from several keys of one tenant, and a per-minute limit held across processes.
const UNITS = 60;
const REQUESTS = 240;
const PER_MINUTE = 25;
// All at once, yet no process sees more of one key's requests open than it allows (64 for a
// server key): past that the refusal is `open-requests`, which is not what this test measures.
const USAGE_REQUESTS = 120;

/** An equilibria body (1 unit) that no other request repeats, so no answer is a cache hit. */
function equilibria(i: number) {
  const model = structuredClone(HASTINGS_POWELL_BENCHMARK.model);
  (model.levels[0] as { growthRate: number }).growthRate = 1 + i * 1e-4;
  return { model };
}

function remaining(a: Answer, policy: string): number {
  return parseRateLimit(a.headers.ratelimit!)[policy]!.r;
}

describe('quota admission is exact under concurrency across API processes', () => {
  let file: string;
  let keys: string[];
  let throttled: string;
  let servers: LiveServer[] = [];

  beforeAll(async () => {
    file = freshDatabaseFile('quota');
    ({ keys, throttled } = await prepareDatabase(file, async ({ db }, demo) => {
      const quotas = new QuotasService(db);
      await quotas.setPlan(DEMO_TENANT.id, { monthlyUnits: UNITS, perMinute: 100_000 }, 'test');
      const service = new KeysService(db);
      const more = [];
      for (let i = 0; i < 3; i++) {
        more.push((await service.issue({ tenantId: DEMO_TENANT.id, kind: 'server' }, 't')).token);
      }
      const other = await new TenantsService(db).create('brockwater', 'Brockwater Fisheries');
      const slow = await service.issue(
        { tenantId: other.id, kind: 'server', perMinute: PER_MINUTE },
        'test',
      );
      return { keys: [demo.serverKey, ...more], throttled: slow.token };
    }));
    // Two processes in the short form (`npm run soak` runs three); they share one WAL file.
    servers = await Promise.all([1, 2].map(() => spawnApi(file)));
  }, 120_000);
  afterAll(async () => {
    await Promise.all(servers.map((s) => s.stop()));
  });

  it(`admits exactly ${UNITS} of ${REQUESTS} concurrent 1-unit requests from 4 keys`, async () => {
    const answers = await Promise.all(
      Array.from({ length: REQUESTS }, (_, i) =>
        send(servers[i % servers.length]!.url, 'POST', '/equilibria', {
          key: keys[i % keys.length],
          body: equilibria(i),
        }),
      ),
    );
    // Nothing else: no SQLITE_BUSY turned into a 500 or 503, every refusal a problem.
    expect(answers.flatMap(problemComplaints)).toEqual([]);
    const admitted = answers.filter((a) => a.status === 200);
    const refused = answers.filter((a) => a.status === 429);
    expect(admitted.length + refused.length).toBe(REQUESTS);
    expect(admitted).toHaveLength(UNITS);
    for (const r of refused) {
      expect(r.json!.limit).toBe('monthly-units');
      expect(Number(r.headers['retry-after'])).toBeGreaterThan(0);
    }
    // Each admission saw its own counter value: the remaining units 59 … 0, each exactly once.
    const seen = admitted.map((a) => remaining(a, 'monthly-units')).sort((a, b) => a - b);
    expect(seen).toEqual(Array.from({ length: UNITS }, (_, i) => i));

    // The ledger, the counter and the usage route agree with the headers.
    await prepareDatabase(file, async ({ db }) => {
      const repo = new QuotasService(db).repository;
      const period = periodOf(Date.now());
      expect(await repo.ledgerTotal(DEMO_TENANT.id, period)).toBe(UNITS);
      expect(await repo.used({ tenantId: DEMO_TENANT.id, period })).toBe(UNITS);
      return {};
    });
    const usage = await send(servers[1]!.url, 'GET', '/usage', { key: keys[2] });
    expect(usage.json).toMatchObject({ used: UNITS, limit: UNITS });
  });

  it(`holds a ${PER_MINUTE}-per-minute key to ${PER_MINUTE} of ${USAGE_REQUESTS} requests`, async () => {
    expect(USAGE_REQUESTS / servers.length).toBeLessThanOrEqual(OPEN_REQUESTS_PER_KEY.server);
    // The limit is per calendar minute; start well inside one so the burst cannot straddle two.
    const intoMinute = Date.now() % 60_000;
    if (intoMinute > 54_000) await new Promise((r) => setTimeout(r, 60_500 - intoMinute));
    const answers = await Promise.all(
      Array.from({ length: USAGE_REQUESTS }, (_, i) =>
        send(servers[i % servers.length]!.url, 'GET', '/usage', { key: throttled }),
      ),
    );
    expect(answers.flatMap(problemComplaints)).toEqual([]);
    const admitted = answers.filter((a) => a.status === 200);
    expect(admitted).toHaveLength(PER_MINUTE);
    const refused = answers.filter((a) => a.status === 429);
    expect(refused).toHaveLength(USAGE_REQUESTS - PER_MINUTE);
    for (const r of refused) {
      expect(r.json!.limit).toBe('per-minute');
      expect(Number(r.headers['retry-after'])).toBeGreaterThan(0);
    }
    const seen = admitted.map((a) => remaining(a, 'per-minute')).sort((a, b) => a - b);
    expect(seen).toEqual(Array.from({ length: PER_MINUTE }, (_, i) => i));
  });
});
