import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findEquilibria, getParameter, withParameter, type ChainModel } from '@tropline/core';
import { parseRateLimit } from '../../server/quotas/rate-limit-headers';
import { DEMO_ORIGIN, startHarness, type Harness } from './api-harness';

// The published regime and equilibria routes over real HTTP, with the demo tenant's seeded
// scenario and browser key: a what-if checked as the published projections check it, then
// answered exactly as the open route answers the request it amounts to.

const MERE = 'larchmere-brackenlow-mere';
const units = (res: { headers: Record<string, string> }) =>
  parseRateLimit(res.headers.ratelimit!)['monthly-units']!.r;

describe('published-scenario regimes and equilibria', () => {
  let h: Harness;
  let published: {
    model: ChainModel;
    initial: Record<string, number>;
    publicParameters: { pointer: string; min: number; max: number }[];
  };
  const post = (route: string, body: unknown) =>
    h
      .call('post', `/published-scenarios/${MERE}/${route}`, h.demo.browserKey, DEMO_ORIGIN)
      .send(body as object);

  beforeAll(async () => {
    h = await startHarness();
    const res = await h
      .call('get', `/published-scenarios/${MERE}`, h.demo.browserKey, DEMO_ORIGIN)
      .expect(200);
    published = res.body;
  });
  afterAll(() => h.close());

  it('assesses the published model with a change in range, as the open route would, at its price', async () => {
    const p = published.publicParameters[0]!;
    const value = p.min + (p.max - p.min) / 4;
    expect(value).not.toBe(getParameter(published.model, p.pointer));
    const bound = await post('regimes', { changes: [{ pointer: p.pointer, value }] });
    expect(bound.status).toBe(200);
    expect(bound.headers['tropline-cache']).toBe('miss');
    // The same request on the open route, from the server's own key: the answer is the cached
    // one (same validation, same cache key), and costs what a cache hit costs.
    const open = await h
      .call('post', '/regimes', h.demo.serverKey)
      .send({ model: withParameter(published.model, p.pointer, value), initial: published.initial })
      .expect(200);
    expect(open.headers['tropline-cache']).toBe('hit');
    expect(open.body).toEqual(bound.body);
    expect(['equilibrium', 'cycle', 'chaotic', 'collapse']).toContain(bound.body.regime);
    // Priced as openapi.yaml prices POST /regimes: ceil((5000 + 5000) × (1 + 2 × 1) / 2000) = 15
    // units at the engine's default transient, window and one exponent.
    const before = units(open);
    const again = await post('regimes', {});
    expect(again.headers['tropline-cache']).toBe('miss');
    expect(before - units(again)).toBe(15);
  });

  it('finds the equilibria of the changed model, the engine’s own', async () => {
    const p = published.publicParameters[0]!;
    const res = await post('equilibria', { changes: [{ pointer: p.pointer, value: p.max }] });
    expect(res.status).toBe(200);
    const model = withParameter(published.model, p.pointer, p.max);
    expect(res.body.equilibria).toEqual(JSON.parse(JSON.stringify(findEquilibria(model))));
    const unchanged = await post('equilibria', { changes: [] }).expect(200);
    expect(unchanged.body).not.toEqual(res.body);
  });

  it('refuses what the publisher did not open, or outside its range, naming each field, for free', async () => {
    const p = published.publicParameters[0]!;
    const first = await post('equilibria', {}).expect(200);
    for (const route of ['regimes', 'equilibria']) {
      const res = await post(route, {
        changes: [
          { pointer: p.pointer, value: p.max * 10 },
          { pointer: '/levels/0/carryingCapacity', value: 1 },
        ],
      });
      expect(res.status).toBe(400);
      expect(res.headers['content-type']).toContain('application/problem+json');
      expect(res.body.errors).toEqual([
        {
          pointer: '/changes/0/value',
          message: `must be between ${p.min} and ${p.max}, the publisher's range`,
        },
        {
          pointer: '/changes/1/pointer',
          message: 'the publisher does not let the public change "/levels/0/carryingCapacity"',
        },
      ]);
      const shape = await post(route, { changes: [], horizon: 10 });
      expect(shape.status).toBe(400);
      expect(shape.body.errors).toEqual([
        { pointer: '/horizon', message: 'unknown field "horizon"' },
      ]);
    }
    const last = await post('equilibria', {}).expect(200);
    // Refusals cost nothing: only the two answered calls (a cache hit each) were charged.
    expect(units(first) - units(last)).toBe(1);
  });

  it('answers 404 for a public id nothing is published as, and 403 from an unlisted origin', async () => {
    const missing = await h
      .call(
        'post',
        '/published-scenarios/larchmere-no-such-place/regimes',
        h.demo.browserKey,
        DEMO_ORIGIN,
      )
      .send({});
    expect(missing.status).toBe(404);
    expect(missing.body.title).toBe('No such published scenario');
    const other = await h
      .call(
        'post',
        `/published-scenarios/${MERE}/equilibria`,
        h.demo.browserKey,
        'https://elsewhere.example',
      )
      .send({});
    expect(other.status).toBe(403);
  });
});
