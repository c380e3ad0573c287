import request from 'supertest';
import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conformsToContract } from '../../tests/api/openapi-contract';
import { memberMeter } from '../quotas/console-usage-repository';
import {
  clockedApp,
  signInDemo,
  type ClockedApp,
  type SignedInAgent,
} from './testing/signed-in-agent';

const TENANT = { 'Tropline-Tenant': 'larchmere' };
const projection = {
  model: HASTINGS_POWELL_BENCHMARK.model,
  initial: HASTINGS_POWELL_BENCHMARK.initial,
  horizon: 200,
  samples: 41,
};
const sweep = {
  model: projection.model,
  initial: projection.initial,
  parameter: '/levels/1/handlingTime',
  from: 0.5,
  to: 0.7,
  steps: 3,
  observe: 'z',
  transient: 20,
  window: 20,
};

describe('/console/compute: the compute routes for signed-in members', () => {
  let t: ClockedApp;
  let analyst: SignedInAgent;

  beforeAll(async () => {
    t = await clockedApp();
    analyst = await signInDemo(t.app, 'analyst');
  });
  afterAll(() => t.close());

  const post = (who: SignedInAgent, path: string, body: unknown) =>
    who.agent
      .post(`/api/v1/console/compute${path}`)
      .set(TENANT)
      .set('X-CSRF-Token', who.csrf)
      .send(body as object);

  it('projects for an analyst exactly as the keyed route does, on the member’s own meter', async () => {
    const mine = await post(analyst, '/projections', projection)
      .expect(200)
      .expect(conformsToContract);
    const keyed = await request(t.app)
      .post('/api/v1/projections')
      .set('Authorization', `Bearer ${t.app.locals.tropline.demoKeys!.serverKey}`)
      .send(projection)
      .expect(200);
    // The same deterministic engine behind both doors: the series agree to the last digit.
    expect(mine.body.series).toEqual(keyed.body.series);
    const usage = await analyst.agent.get('/api/v1/console/usage').set(TENANT).expect(200);
    const meter = memberMeter(analyst.session.user.id);
    const row = (usage.body.byKey as { keyId: string; units: number }[]).find(
      (k) => k.keyId === meter,
    );
    expect(row?.units).toBeGreaterThan(0);
  });

  it('refuses a viewer by the role matrix, a change without CSRF, and anyone signed out', async () => {
    const viewer = await signInDemo(t.app, 'viewer');
    const refused = await post(viewer, '/projections', projection)
      .expect(403)
      .expect('Content-Type', /application\/problem\+json/);
    expect(refused.body.action).toBe('analyses:run');
    await analyst.agent
      .post('/api/v1/console/compute/projections')
      .set(TENANT)
      .send(projection)
      .expect(403);
    await request(t.app).post('/api/v1/console/compute/projections').send(projection).expect(401);
  });

  it('names the field of an invalid request by JSON Pointer', async () => {
    const res = await post(analyst, '/projections', { ...projection, horizon: -1 }).expect(400);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toContain('/horizon');
  });

  it('runs a sweep as a job the member follows to its result, by GET and by event stream', async () => {
    const created = await post(analyst, '/sweeps', sweep).expect(202);
    const id = String(created.body.id);
    let job = created.body as { status: string; result?: { points: unknown[] } };
    for (let i = 0; i < 600 && job.status !== 'succeeded' && job.status !== 'failed'; i++) {
      await new Promise((r) => setTimeout(r, 50));
      job = (await analyst.agent.get(`/api/v1/console/compute/jobs/${id}`).set(TENANT).expect(200))
        .body;
    }
    expect(job.status, JSON.stringify(job)).toBe('succeeded');
    expect(job.result?.points.length).toBeGreaterThan(0);
    const events = await analyst.agent
      .get(`/api/v1/console/compute/jobs/${id}/events`)
      .set(TENANT)
      .expect(200)
      .expect('Content-Type', /text\/event-stream/);
    expect(events.text).toMatch(/event: job\ndata: \{.*"status":"succeeded"/);
  });
});
