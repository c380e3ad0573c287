import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { project } from '@tropline/core';
import { parseRateLimit } from '../../server/quotas/rate-limit-headers';
import { benchmarkProjection, DEMO_ORIGIN, startHarness, type Harness } from './api-harness';

describe('POST /api/v1/projections', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness({}, { computeLimits: { workerWallTimeMs: 1000 } });
  });
  afterAll(() => h.close());

  it('answers the engine’s projection bit for bit, with cautions and evenly spaced times', async () => {
    const body = benchmarkProjection(200, 401);
    const res = await h.call('post', '/projections', h.demo.serverKey).send(body).expect(200);
    const direct = JSON.parse(JSON.stringify(project(body)));
    expect(res.body).toEqual(direct);
    // toEqual treats -0 and 0 alike; compare the exact doubles too.
    const bits = (xs: number[]) =>
      xs.map((x) => Buffer.from(new Float64Array([x]).buffer).toString('hex'));
    for (const id of Object.keys(direct.series)) {
      expect(bits(res.body.series[id])).toEqual(bits(project(body).series[id]));
    }
    expect(res.body.times).toHaveLength(401);
    expect(res.body.times[0]).toBe(0);
    expect(res.body.times[400]).toBe(200);
    expect(res.body.cautions.length).toBeGreaterThan(0);
    expect(res.headers['tropline-cache']).toBe('miss');
  });

  it('answers an identical request from the cache, charging 1 unit and saying so', async () => {
    const body = benchmarkProjection(120, 121);
    const first = await h.call('post', '/projections', h.demo.serverKey).send(body).expect(200);
    // Same body, keys in another order: the same canonical JSON.
    const reordered = {
      samples: body.samples,
      horizon: body.horizon,
      initial: body.initial,
      model: body.model,
    };
    const second = await h
      .call('post', '/projections', h.demo.serverKey)
      .send(reordered)
      .expect(200);
    expect(second.headers['tropline-cache']).toBe('hit');
    expect(second.body).toEqual(first.body);
    const before = parseRateLimit(first.headers.ratelimit)['monthly-units'].r;
    const after = parseRateLimit(second.headers.ratelimit)['monthly-units'].r;
    expect(before - after).toBe(1);
  });

  it('serves a browser key from a listed origin with CORS for that origin only', async () => {
    const res = await h
      .call('post', '/projections', h.demo.browserKey, DEMO_ORIGIN)
      .send(benchmarkProjection())
      .expect(200);
    expect(res.headers['access-control-allow-origin']).toBe(DEMO_ORIGIN);
    expect(res.headers['access-control-expose-headers']).toMatch(/RateLimit/);
    const pre = await h
      .call('options', '/projections', undefined, DEMO_ORIGIN)
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization, content-type')
      .expect(204);
    expect(pre.headers['access-control-allow-origin']).toBe(DEMO_ORIGIN);
    expect(pre.headers['access-control-allow-headers']).toMatch(/Authorization/);
  });

  it('names every bad field with a pointer and charges nothing', async () => {
    const before = await h.call('get', '/usage', h.demo.serverKey).expect(200);
    const body = benchmarkProjection();
    const bad = {
      ...body,
      horizon: 1e9,
      samples: 1,
      initial: { ...body.initial, x: -1 },
      model: {
        ...body.model,
        levels: body.model.levels.map((l, i) => (i === 1 ? { ...l, attackRate: 0 } : l)),
      },
    };
    const res = await h.call('post', '/projections', h.demo.serverKey).send(bad).expect(400);
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer);
    expect(pointers).toEqual(
      expect.arrayContaining(['/horizon', '/samples', '/model/levels/1/attackRate']),
    );
    const after = await h.call('get', '/usage', h.demo.serverKey).expect(200);
    expect(after.body.used).toBe(before.body.used);
  });

  it('refuses a wall-time-bound breach as 422 naming /horizon, refunding the units', async () => {
    // Its own server with a 5 ms budget for worker projections: the projection below (horizon
    // 100 000 at tolerance 1e-13) needs hundreds of milliseconds even on a fast idle machine.
    const tight = await startHarness({}, { computeLimits: { workerWallTimeMs: 5 } });
    try {
      const before = await tight.call('get', '/usage', tight.demo.serverKey).expect(200);
      const body = { ...benchmarkProjection(100_000, 20_001), tolerance: 1e-13 };
      const res = await tight
        .call('post', '/projections', tight.demo.serverKey)
        .send(body)
        .expect(422);
      expect(res.body.errors[0].pointer).toBe('/horizon');
      expect(['time-limit', 'step-limit']).toContain(res.body.cause);
      const after = await tight.call('get', '/usage', tight.demo.serverKey).expect(200);
      expect(after.body.used).toBe(before.body.used);
    } finally {
      await tight.close();
    }
  });

  it('runs a long projection on a worker thread with the same answer bit for bit', async () => {
    const body = benchmarkProjection(2500, 251);
    const res = await h.call('post', '/projections', h.demo.serverKey).send(body).expect(200);
    expect(JSON.stringify(res.body)).toBe(JSON.stringify(project(body)));
  });

  it('answers equilibria, the interior one included', async () => {
    const { model } = benchmarkProjection();
    const res = await h.call('post', '/equilibria', h.demo.serverKey).send({ model }).expect(200);
    const kinds = res.body.equilibria.map((e: { kind: string }) => e.kind);
    expect(kinds).toContain('interior');
    expect(kinds).toContain('extinction');
  });
});
