import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KeysService } from '../../server/keys/keys-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { benchmarkProjection, startHarness, type Harness } from './api-harness';

type Json = unknown;

function isEmptyObject(v: unknown): boolean {
  return v !== null && typeof v === 'object' && !Array.isArray(v) && Object.keys(v).length === 0;
}

/** Numeric leaves of a valid projection body, and values that are wrong for every one. */
const NUMERIC_PATHS = [
  ['horizon'],
  ['samples'],
  ['tolerance'],
  ['initial', 'y'],
  ['model', 'levels', 0, 'growthRate'],
  ['model', 'levels', 0, 'carryingCapacity'],
  ['model', 'levels', 1, 'attackRate'],
  ['model', 'levels', 1, 'handlingTime'],
  ['model', 'levels', 2, 'efficiency'],
  ['model', 'levels', 2, 'mortality'],
] as const;

const wrongNumber = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.constant(null),
  fc.boolean(),
  fc.array(fc.integer(), { maxLength: 3 }),
  fc.dictionary(fc.string({ maxLength: 5 }), fc.integer(), { maxKeys: 3 }),
  fc.double({ min: -1e300, max: -1e-300, noNaN: true }),
  fc.constantFrom(1e300, Number.MAX_VALUE),
);

function setPath(body: Json, path: readonly (string | number)[], value: unknown): Json {
  const copy = structuredClone(body) as Record<string | number, unknown>;
  let node = copy as Record<string | number, unknown>;
  for (const k of path.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
  // defineProperty, so `__proto__` becomes an own key as JSON.parse would make it.
  Object.defineProperty(node, path[path.length - 1]!, {
    value,
    enumerable: true,
    writable: true,
    configurable: true,
  });
  return copy;
}

function nested(depth: number): unknown {
  let v: unknown = 1;
  for (let i = 0; i < depth; i++) v = i % 2 ? { a: v } : [v];
  return v;
}

const base = { ...benchmarkProjection(20, 21), tolerance: 1e-6 };

/** Bodies that can never be valid for the compute routes. */
const hostile = fc.oneof(
  fc.jsonValue({ maxDepth: 4 }),
  fc.constantFrom(...NUMERIC_PATHS).chain((path) => wrongNumber.map((v) => setPath(base, path, v))),
  fc
    .constantFrom([], ['model'], ['initial'], ['model', 'levels', 1])
    .chain((path) =>
      fc
        .constantFrom('__proto__', 'constructor', 'extra', '$where', '')
        .map((key) => setPath(base, [...path, key], { polluted: true })),
    ),
  fc.integer({ min: 50, max: 2000 }).map((d) => ({ ...base, model: nested(d) })),
  fc
    .array(fc.constant(base.model.levels[1]), { minLength: 4, maxLength: 40 })
    .map((extra) => setPath(base, ['model', 'levels'], [...base.model.levels, ...extra])),
);

describe('hostile and malformed bodies', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  async function expectProblem(path: string, body: unknown, raw = false, key = h.demo.serverKey) {
    const res = await h
      .call('post', path, key)
      .set('content-type', 'application/json')
      .send(raw ? (body as string) : JSON.stringify(body));
    expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.status).toBe(res.status);
    if (res.status === 400 || res.status === 422) {
      expect(res.body.errors.length).toBeGreaterThan(0);
      for (const e of res.body.errors) expect(e.pointer).toMatch(/^(\/.*)?$/);
    }
  }

  for (const path of ['/projections', '/equilibria']) {
    it(`answers every hostile ${path} body with a 4xx problem naming a field`, async () => {
      await fc.assert(
        fc.asyncProperty(hostile, (body) => expectProblem(path, body)),
        { numRuns: 60 },
      );
    });
  }

  it('answers bodies that are not JSON objects, or not JSON, with a problem', async () => {
    const texts = fc.oneof(
      fc.string({ maxLength: 40 }).map((s) => `{"model": ${s}`),
      fc.constantFrom('[]', 'null', '"text"', '42', '{"a":1}{', '\u0000', '{'.repeat(5000)),
    );
    await fc.assert(
      fc.asyncProperty(texts, (text) => expectProblem('/projections', text, true)),
      { numRuns: 40 },
    );
  });

  it('answers hostile key requests with problems naming a field', async () => {
    const admin = await new KeysService(h.app.locals.tropline.db, h.clock.now).issue(
      { tenantId: DEMO_TENANT.id, kind: 'server', scopes: ['keys:manage'] },
      'test',
    );
    const keyBodies = fc.oneof(
      fc.jsonValue({ maxDepth: 3 }),
      fc.record({
        kind: fc.string({ maxLength: 8 }),
        origins: fc.array(fc.string({ maxLength: 30 }), { minLength: 1, maxLength: 3 }),
        scopes: fc.anything({ maxDepth: 2 }),
      }),
      fc.record({
        kind: fc.constant('browser'),
        origins: fc
          .array(fc.webUrl({ withQueryParameters: true, withFragments: true }), {
            minLength: 1,
            maxLength: 3,
          })
          .filter((urls) => urls.some((u) => /[?#]|\/[^/]/.test(u.replace(/^https?:\/\//, '')))),
      }),
    );
    await fc.assert(
      fc.asyncProperty(keyBodies, (body) => expectProblem('/keys', body, false, admin.token)),
      { numRuns: 40 },
    );
    await fc.assert(
      fc.asyncProperty(
        fc.jsonValue({ maxDepth: 3 }).filter((v) => !isEmptyObject(v)),
        (body) => expectProblem(`/keys/${admin.key.id}/rotate`, body, false, admin.token),
      ),
      { numRuns: 20 },
    );
  });

  it('refuses an oversized body with 413 and keeps answering', async () => {
    const big = JSON.stringify({ ...base, pad: 'x'.repeat(300 * 1024) });
    const res = await h
      .call('post', '/projections', h.demo.serverKey)
      .set('content-type', 'application/json')
      .send(big)
      .expect(413);
    expect(res.body.limit).toBeGreaterThan(0);
    await request(h.app).get('/api/v1/health').expect(200);
    await h.call('post', '/projections', h.demo.serverKey).send(base).expect(200);
  });
});
