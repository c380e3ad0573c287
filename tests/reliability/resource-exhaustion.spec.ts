import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testConfig } from '../../server/config';
import { serve, type RunningServer } from '../../server/serve';
import { KeysService } from '../../server/keys/keys-service';
import { QuotasService } from '../../server/quotas/quotas-service';
import { TenantsService } from '../../server/tenants/tenants-service';
import { heavySweep, prepareFlood, runFlood } from './job-flood';
import { freshDatabaseFile, send } from './live-server';

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

  // Found by `npm run soak`: the bound was checked before the job row was written, so a burst
  // of simultaneous submissions all passed the check and a tenant held 9 jobs, not 4.
  it('holds a burst of simultaneous submissions to the per-tenant bound', async () => {
    const { db } = running.app.locals.tropline;
    const tenant = await new TenantsService(db).create('wrenfold', 'Wrenfold Fisheries');
    await new QuotasService(db).setPlan(tenant.id, { monthlyUnits: 1e8, perMinute: 1e6 }, 't');
    const key = await new KeysService(db).issue({ tenantId: tenant.id, kind: 'server' }, 't');
    const answers = await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        send(base, 'POST', '/sweeps', { key: key.token, body: heavySweep(1000 + i) }),
      ),
    );
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((s) => s !== 202 && s !== 429)).toEqual([]);
    expect(statuses.filter((s) => s === 202).length).toBeLessThanOrEqual(PER_TENANT_ACTIVE);
    const active = await db('jobs')
      .where({ tenant_id: tenant.id })
      .whereIn('status', ['queued', 'running'])
      .count<{ n: number }[]>({ n: '*' });
    expect(Number(active[0]!.n)).toBeLessThanOrEqual(PER_TENANT_ACTIVE);
    // A refused submission cost nothing: only the admitted jobs' units are on the ledger.
    const usage = await send(base, 'GET', '/usage', { key: key.token });
    const admittedUnits = answers
      .filter((a) => a.status === 202)
      .reduce((sum, a) => sum + Number(a.json!.units ?? 0), 0);
    expect(usage.json!.used).toBe(admittedUnits);
  });

  // Fairness between tenants' jobs (server/jobs/jobs-service.ts, shared/pool/fair-scheduler.ts):
  // the flood fills its bound with four sweeps at the work bound, each cut into about 240
  // chunks; another tenant's one-chunk sweep starts beside them and, owners taking turns chunk
  // by chunk, is done after at most a couple of the flood's chunks, while the flood still holds
  // all four jobs (it has hundreds of chunks to go). What is checked is the order the scheduler
  // fixes, not a speed.
  it('runs another tenant’s job beside the flood, in turn, so it is done while the flood still runs', async () => {
    const { db } = running.app.locals.tropline;
    const tenant = await new TenantsService(db).create('saltcote', 'Saltcote Reservoir Board');
    await new QuotasService(db).setPlan(tenant.id, { monthlyUnits: 1e8, perMinute: 1e6 }, 't');
    const flooder = await new KeysService(db).issue({ tenantId: tenant.id, kind: 'server' }, 't');
    const atBound = (n: number) => ({ ...heavySweep(n, 1000), transient: 30_000, window: 30_000 });
    const flood = await Promise.all(
      [1, 2, 3, 4].map((i) =>
        send(base, 'POST', '/sweeps', { key: flooder.token, body: atBound(5000 + i) }),
      ),
    );
    expect(flood.map((a) => a.status)).toEqual([202, 202, 202, 202]);
    const small = await send(base, 'POST', '/sweeps', {
      key: keys.victimKey,
      body: heavySweep(7000, 2),
    });
    expect(small.status).toBe(202);
    let state = small.json!;
    while (state.status === 'queued' || state.status === 'running') {
      await new Promise((r) => setTimeout(r, 50));
      state = (await send(base, 'GET', `/jobs/${String(small.json!.id)}`, { key: keys.victimKey }))
        .json!;
    }
    expect(state.status).toBe('succeeded');
    const floodNow = await Promise.all(
      flood.map((a) => send(base, 'GET', `/jobs/${String(a.json!.id)}`, { key: flooder.token })),
    );
    expect(floodNow.map((a) => a.json!.status)).toEqual([
      'running',
      'running',
      'running',
      'running',
    ]);
    // Cancelled, they end at once (the pool drops their waiting chunks).
    for (const a of flood) {
      await send(base, 'DELETE', `/jobs/${String(a.json!.id)}`, { key: flooder.token });
    }
  });

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
