import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testConfig } from '../../server/config';
import { serve, type RunningServer } from '../../server/serve';
import { prepareFlood, runFlood } from './job-flood';
import { freshDatabaseFile } from './live-server';

// One process suffices: the flood and the victim share its worker pools, which is the point.
// The test asserts what must hold (bounded queue, every victim answered); the victim's p99
// with and without the flood is measured by `npm run soak`, which prints it.
const PER_TENANT_ACTIVE = 4; // server/auth/keyed-api.ts

describe('resource exhaustion: one tenant flooding heavy jobs', () => {
  let running: RunningServer;
  let base: string;
  let keys: Awaited<ReturnType<typeof prepareFlood>>;
  beforeAll(async () => {
    running = await serve(testConfig({ sqliteFile: freshDatabaseFile('flood'), port: 0 }));
    base = `http://127.0.0.1:${running.port}`;
    const ctx = running.app.locals.tropline;
    keys = await prepareFlood(ctx.db, ctx.demoKeys!.serverKey);
  });
  afterAll(() => running.stop());

  it('bounds the flooding tenant’s queue and answers every one of the victim’s projections', async () => {
    const { db } = running.app.locals.tropline;
    const report = await runFlood(base, keys, {
      durationMs: 2500,
      flooders: 4,
      activeJobs: async () => {
        const row = await db('jobs')
          .where({ tenant_id: keys.floodTenantId })
          .whereIn('status', ['queued', 'running'])
          .count<{ n: number }[]>({ n: '*' });
        return Number(row[0]!.n);
      },
    });
    // The flood was real: the server took jobs and then refused more, by the per-tenant bound.
    expect(report.flood.accepted).toBeGreaterThanOrEqual(PER_TENANT_ACTIVE);
    expect(report.flood.refusedBusy).toBeGreaterThan(0);
    expect(report.flood.other).toEqual([]);
    expect(report.maxActive).toBeLessThanOrEqual(PER_TENANT_ACTIVE);
    // The victim was never refused or failed, however busy the pools were.
    expect(report.victim.sent).toBeGreaterThan(0);
    expect(report.victim.other).toEqual([]);
    expect(report.victim.ok).toBe(report.victim.sent);
  });
});
