import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JobsRepository } from '../../server/jobs/jobs-repository';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { benchmarkProjection, startHarness, type Harness } from './api-harness';
import { contract } from './openapi-contract';

describe('tenant isolation: a key of tenant B never reaches anything of tenant A', () => {
  let h: Harness;
  let keyA: string;
  let keyAId: string;
  let keyB: string;
  let jobA: string;
  beforeAll(async () => {
    h = await startHarness();
    const { db } = h.app.locals.tropline;
    const keys = new KeysService(db, h.clock.now);
    const a = await keys.issue(
      { tenantId: DEMO_TENANT.id, kind: 'server', scopes: [...SERVER_SCOPES] },
      'test',
    );
    keyA = a.token;
    keyAId = a.key.id;
    const fenwick = await new TenantsService(db, h.clock.now).create(
      'fenwick',
      'Fenwick Water Board',
    );
    keyB = (
      await keys.issue({ tenantId: fenwick.id, kind: 'server', scopes: [...SERVER_SCOPES] }, 'test')
    ).token;
    // A finished job of tenant A, stored as the job service stores one.
    jobA = randomUUID();
    const at = new Date(h.clock.now()).toISOString();
    await new JobsRepository(db).insert({
      id: jobA,
      tenantId: DEMO_TENANT.id,
      keyId: keyAId,
      kind: 'sweeps',
      status: 'queued',
      progress: 0,
      requestHash: 'a'.repeat(64),
      idempotencyKey: 'shared-key',
      request: {},
      units: 5,
      cancelRequested: false,
      createdAt: at,
      expiresAt: new Date(h.clock.now() + 3600_000).toISOString(),
    });
    await h.call('post', '/projections', keyA).send(benchmarkProjection(30, 31)).expect(200);
    await h
      .call('post', '/equilibria', keyA)
      .send({ model: benchmarkProjection().model })
      .expect(200);
  });
  afterAll(() => h.close());

  /** One probe per keyed operation of the spec: B aims at A's objects, or at shared inputs. */
  const probes: Record<string, () => Promise<void>> = {
    'get /keys': async () => {
      const res = await h.call('get', '/keys', keyB).expect(200);
      expect(res.body.keys.map((k: { id: string }) => k.id)).not.toContain(keyAId);
    },
    'post /keys': async () => {
      const res = await h.call('post', '/keys', keyB).send({ kind: 'server' }).expect(201);
      const listA = await h.call('get', '/keys', keyA).expect(200);
      expect(listA.body.keys.map((k: { id: string }) => k.id)).not.toContain(res.body.key.id);
    },
    'delete /keys/{id}': async () => {
      await h.call('delete', `/keys/${keyAId}`, keyB).expect(404);
      await h.call('get', '/usage', keyA).expect(200);
    },
    'post /keys/{id}/rotate': async () => {
      await h.call('post', `/keys/${keyAId}/rotate`, keyB).send({}).expect(404);
    },
    'get /usage': async () => {
      const b = await h.call('get', '/usage', keyB).expect(200);
      const a = await h.call('get', '/usage', keyA).expect(200);
      expect(a.body.used).toBeGreaterThan(0);
      expect(b.body.used).toBe(0);
    },
    'get /jobs/{id}': async () => {
      await h.call('get', `/jobs/${jobA}`, keyB).expect(404);
      await h.call('get', `/jobs/${jobA}`, keyA).expect(200);
    },
    'delete /jobs/{id}': async () => {
      await h.call('delete', `/jobs/${jobA}`, keyB).expect(404);
    },
    'get /jobs/{id}/events': async () => {
      await h.call('get', `/jobs/${jobA}/events`, keyB).expect(404);
    },
    'post /projections': async () => {
      const res = await h
        .call('post', '/projections', keyB)
        .send(benchmarkProjection(30, 31))
        .expect(200);
      expect(res.headers['tropline-cache']).toBe('miss'); // A's cached answer is A's
    },
    'post /equilibria': async () => {
      const res = await h
        .call('post', '/equilibria', keyB)
        .send({ model: benchmarkProjection().model })
        .expect(200);
      expect(res.headers['tropline-cache']).toBe('miss');
    },
  };

  it('has a probe for every keyed operation in the spec', () => {
    const keyed = contract
      .operations()
      .filter(
        ({ op, method }) =>
          // Keyed operations inherit the bearer schemes; console ones declare the cookie.
          method !== 'options' && op.security === undefined,
      )
      .map(({ method, template }) => `${method} ${template}`);
    const analyses = [
      'post /regimes',
      'post /sweeps',
      'post /regime-maps',
      'post /ensembles',
      'post /comparisons',
    ];
    expect(keyed.filter((k) => !analyses.includes(k)).sort()).toEqual(Object.keys(probes).sort());
  });

  for (const [route, probe] of Object.entries(probes)) {
    it(route, probe);
  }
});
