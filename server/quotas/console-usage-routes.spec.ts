import request from 'supertest';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conformsToContract } from '../../tests/api/openapi-contract';
import { clockedApp, signInDemo, type ClockedApp } from '../accounts/testing/signed-in-agent';
import { memberMeter } from './console-usage-repository';

const DAY = 86_400_000;

interface ConsoleUsage {
  period: string;
  used: number;
  limit: number;
  resetsAt: string;
  perMinute: number;
  browserPerMinute: number;
  byDay: { day: string; units: number }[];
  byKey: { keyId: string; name: string | null; units: number }[];
  byEndpoint: { endpoint: string; units: number }[];
  alerts: { sentAt: string; threshold: number }[];
}

const total = (rows: { units: number }[]) => rows.reduce((s, r) => s + r.units, 0);

describe('GET /console/usage', () => {
  let t: ClockedApp;
  let serverKey: string;
  let serverKeyId: string;

  function project(horizon: number) {
    return request(t.app)
      .post('/api/v1/projections')
      .set('Authorization', `Bearer ${serverKey}`)
      .send({
        model: HASTINGS_POWELL_BENCHMARK.model,
        initial: HASTINGS_POWELL_BENCHMARK.initial,
        horizon,
        samples: 51,
      })
      .expect(200);
  }

  // Sessions end after two idle hours and the clock moves by days, so each read signs in anew.
  async function usage(): Promise<ConsoleUsage> {
    const viewer = await signInDemo(t.app, 'viewer');
    const res = await viewer.agent
      .get('/api/v1/console/usage')
      .set('Tropline-Tenant', 'larchmere')
      .expect(200)
      .expect(conformsToContract);
    return res.body as ConsoleUsage;
  }

  beforeAll(async () => {
    t = await clockedApp();
    serverKey = t.app.locals.tropline.demoKeys!.serverKey;
    serverKeyId = serverKey.split('_')[2]!;
    const operator = await signInDemo(t.app, 'operator');
    await operator.agent
      .put('/api/v1/tenants/larchmere/plan')
      .set('X-CSRF-Token', operator.csrf)
      .send({ monthlyUnits: 10, perMinute: 120, browserPerMinute: 30 })
      .expect(200);
  });
  afterAll(() => t.close());

  it('refuses without a session and outside the tenant', async () => {
    await request(t.app).get('/api/v1/console/usage').expect(401).expect(conformsToContract);
    const viewer = await signInDemo(t.app, 'viewer');
    await viewer.agent
      .get('/api/v1/console/usage')
      .set('Tropline-Tenant', 'hobcairn')
      .expect(403)
      .expect(conformsToContract);
  });

  it('shows the plan and an empty month before anything is charged', async () => {
    const u = await usage();
    expect(u).toMatchObject({
      period: '2026-12',
      used: 0,
      limit: 10,
      resetsAt: '2027-01-01T00:00:00.000Z',
      perMinute: 120,
      browserPerMinute: 30,
      byDay: [],
      byKey: [],
      byEndpoint: [],
      alerts: [],
    });
  });

  it('sums the ledger per day, key and endpoint to what the counter charged', async () => {
    await project(50);
    await project(60);
    await request(t.app)
      .get('/api/v1/usage')
      .set('Authorization', `Bearer ${serverKey}`)
      .expect(200);
    t.advance(DAY);
    await project(70);
    const u = await usage();
    // Each benchmark projection of ≤ 1000 time units and 51 samples costs 2 units; /usage is free.
    expect(u.used).toBe(6);
    expect(u.byDay).toEqual([
      { day: '2026-12-07', units: 4 },
      { day: '2026-12-08', units: 2 },
    ]);
    expect(u.byKey).toEqual([{ keyId: serverKeyId, name: 'Demo server key', units: 6 }]);
    expect(u.byEndpoint).toEqual([
      { endpoint: 'projections', units: 6 },
      { endpoint: 'usage', units: 0 },
    ]);
    expect(total(u.byDay)).toBe(u.used);
    expect(u.alerts).toEqual([]);
  });

  it('lists the quota alerts mailed this month once a threshold is crossed', async () => {
    await project(80); // 8 of 10 units: the 80 % threshold
    await t.app.locals.tropline.accounts.mailer.flush();
    const u = await usage();
    expect(u.used).toBe(8);
    expect(u.alerts).toEqual([{ sentAt: '2026-12-08T09:00:00.000Z', threshold: 80 }]);
  });

  it("names a signed-in member's calibrations by the member", async () => {
    const analyst = await signInDemo(t.app, 'analyst');
    const moor = (await analyst.agent.get('/api/v1/scenarios').expect(200)).body.scenarios.find(
      (s: { name: string }) => s.name.includes('Hobcairn'),
    );
    await analyst.agent
      .post(`/api/v1/scenarios/${moor.id}/calibrations`)
      .set('X-CSRF-Token', analyst.csrf)
      .send({
        dataset: 1,
        parameters: [{ pointer: '/levels/1/mortality', min: 0.1, max: 1 }],
        starts: 1,
        maxIterations: 1,
      })
      .expect(202);
    const u = await usage();
    const row = u.byKey.find((k) => k.keyId === memberMeter(analyst.session.user.id));
    expect(row?.name).toBe('Priya Calder (signed in)');
    expect(row!.units).toBeGreaterThan(0);
    expect(total(u.byKey)).toBe(u.used);
  });

  it('starts afresh in the next month', async () => {
    t.advance(30 * DAY);
    const u = await usage();
    expect(u).toMatchObject({ period: '2027-01', used: 0, byDay: [], byKey: [], alerts: [] });
  });
});
