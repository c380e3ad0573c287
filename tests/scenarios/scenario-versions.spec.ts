import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { UPLAND_DEMO } from '@tropline/core';
import { signInDemo } from '../../server/accounts/testing/signed-in-agent';
import { AuditRepository } from '../../server/audit/audit-repository';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { DEMO_ORIGIN, startHarness, type Harness } from '../api/api-harness';
import { conformsToContract } from '../api/openapi-contract';

const content = {
  name: 'Hobcairn Moor, cull trial',
  location: 'Hobcairn Moor (invented)',
  model: UPLAND_DEMO.model,
  initial: UPLAND_DEMO.initial,
  horizon: 50,
  publicParameters: [{ pointer: '/levels/1/mortality', min: 0.2, max: 0.5, label: 'Deer cull' }],
};

describe('scenario versions over HTTP (keys and sessions)', () => {
  let h: Harness;
  let id: string;
  beforeAll(async () => {
    h = await startHarness();
    const res = await h
      .call('post', '/scenarios', h.demo.serverKey)
      .send({ ...content, changeNote: 'First draft' })
      .expect(201);
    id = res.body.scenario.id;
  });
  afterAll(() => h.close());

  it('keeps every save as an immutable version with author, time and note', async () => {
    const v2 = { ...content, model: { ...content.model }, changeNote: 'Higher deer mortality' };
    v2.model = structuredClone(content.model);
    (v2.model.levels[1] as { mortality: number }).mortality = 0.35;
    await h.call('post', `/scenarios/${id}/versions`, h.demo.serverKey).send(v2).expect(201);
    const first = await h.call('get', `/scenarios/${id}/versions/1`, h.demo.serverKey).expect(200);
    expect(first.body.content.model.levels[1].mortality).toBe(0.3);
    expect(first.body.changeNote).toBe('First draft');
    expect(first.body.author).toMatch(/^key:/);
    const cmp = await h
      .call('get', `/scenarios/${id}/comparison?from=1&to=2`, h.demo.serverKey)
      .expect(200);
    expect(cmp.body.changes).toEqual([
      { pointer: '/model/levels/1/mortality', before: 0.3, after: 0.35 },
    ]);
    // A save from a stale base is refused, so nobody overwrites a later version unseen.
    const stale = await h
      .call('post', `/scenarios/${id}/versions`, h.demo.serverKey)
      .send({ ...content, changeNote: 'stale', baseVersion: 1 })
      .expect(409);
    expect(stale.body.errors[0].pointer).toBe('/baseVersion');
  });

  it('refuses a save without a note, or public ranges outside the model, naming the field', async () => {
    const res = await h
      .call('post', `/scenarios/${id}/versions`, h.demo.serverKey)
      .send({
        ...content,
        publicParameters: [
          { pointer: '/levels/1/mortality', min: -1, max: 0.5 },
          { pointer: '/levels/7/mortality', min: 0, max: 1 },
        ],
      })
      .expect(400);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(
      expect.arrayContaining(['/publicParameters/0/min', '/publicParameters/1/pointer']),
    );
    const noNote = await h
      .call('post', `/scenarios/${id}/versions`, h.demo.serverKey)
      .send(content)
      .expect(400);
    expect(noNote.body.errors[0].pointer).toBe('/changeNote');
  });

  it('publishes drafts only, retires the one before, and audits both', async () => {
    const pub = await h
      .call('post', `/scenarios/${id}/versions/1/publish`, h.demo.serverKey)
      .expect(200);
    const publicId = pub.body.publicId as string;
    await h.call('post', `/scenarios/${id}/versions/1/publish`, h.demo.serverKey).expect(409);
    const second = await h
      .call('post', `/scenarios/${id}/versions/2/publish`, h.demo.serverKey)
      .expect(200);
    expect(second.body.publicId).toBe(publicId);
    const first = await h.call('get', `/scenarios/${id}/versions/1`, h.demo.serverKey).expect(200);
    expect(first.body.status).toBe('retired');
    await h.call('post', `/scenarios/${id}/versions/1/retire`, h.demo.serverKey).expect(409);
    const events = await new AuditRepository(h.app.locals.tropline.db).listForTenant(
      DEMO_TENANT.id,
    );
    // One event per publication; the second names the version it retired, and each the caller's
    // address (supertest's loopback).
    const mine = events.filter((e) => e.target === `scenario:${id}`);
    expect(mine.map((e) => e.action)).toEqual(['scenario.published', 'scenario.published']);
    expect(mine.map((e) => e.detail)).toEqual(
      expect.arrayContaining([
        { version: 2, publicId, replaced: 1 },
        { version: 1, publicId },
      ]),
    );
    for (const e of mine) expect(e.address).toMatch(/127\.0\.0\.1|::1/);
  });

  it('lets a browser key read only the published version, and bounds its what-ifs', async () => {
    const { body } = await h.call('get', `/scenarios/${id}`, h.demo.serverKey).expect(200);
    const publicId = body.publicId as string;
    const browser = h.demo.browserKey;
    await h.call('get', `/scenarios/${id}`, browser, DEMO_ORIGIN).expect(403);
    const read = await h
      .call('get', `/published-scenarios/${publicId}`, browser, DEMO_ORIGIN)
      .expect(200);
    expect(read.body.version).toBe(2);
    expect(read.body.publicParameters[0].pointer).toBe('/levels/1/mortality');
    const ok = await h
      .call('post', `/published-scenarios/${publicId}/projections`, browser, DEMO_ORIGIN)
      .send({ changes: [{ pointer: '/levels/1/mortality', value: 0.45 }], samples: 11 })
      .expect(200);
    expect(ok.body.times).toHaveLength(11);
    expect(ok.body.cautions.length).toBeGreaterThan(0);
    const out = await h
      .call('post', `/published-scenarios/${publicId}/projections`, browser, DEMO_ORIGIN)
      .send({
        changes: [
          { pointer: '/levels/1/mortality', value: 0.9 },
          { pointer: '/levels/0/growthRate', value: 1 },
        ],
      })
      .expect(400);
    expect(out.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual([
      '/changes/0/value',
      '/changes/1/pointer',
    ]);
    await h.call('post', `/scenarios/${id}/versions/2/retire`, h.demo.serverKey).expect(200);
    await h.call('get', `/published-scenarios/${publicId}`, browser, DEMO_ORIGIN).expect(404);
  });

  it('exports a documented file and imports it back, listing every error of a bad one', async () => {
    const file = await h
      .call('get', `/scenarios/${id}/versions/2/export`, h.demo.serverKey)
      .expect(200);
    expect(file.body.format).toBe('tropline.scenario');
    const imported = await h
      .call('post', '/scenario-imports', h.demo.serverKey)
      .send(file.body)
      .expect(201);
    const copy = await h
      .call('get', `/scenarios/${imported.body.scenario.id}/versions/1`, h.demo.serverKey)
      .expect(200);
    expect(copy.body.content).toEqual(file.body.scenario);
    const bad = structuredClone(file.body);
    bad.formatVersion = 9;
    bad.scenario.model.levels[1].attackRate = -1;
    bad.scenario.horizon = 'long';
    const refused = await h.call('post', '/scenario-imports', h.demo.serverKey).send(bad);
    expect(refused.status).toBe(400);
    // Every error at once: the file's, the content's shape, and the model inside it.
    expect(refused.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(
      expect.arrayContaining([
        '/formatVersion',
        '/scenario/horizon',
        '/scenario/model/levels/1/attackRate',
      ]),
    );
    // With a valid model, the start and the public ranges are checked against it too.
    const second = structuredClone(file.body);
    second.scenario.name = '';
    second.scenario.initial.deer = -2;
    second.scenario.publicParameters = [{ pointer: '/levels/1/mortality', min: 0.2, max: 2e13 }];
    const all = await h.call('post', '/scenario-imports', h.demo.serverKey).send(second);
    expect(all.status).toBe(400);
    expect(all.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(
      expect.arrayContaining([
        '/scenario/name',
        '/scenario/initial/deer',
        '/scenario/publicParameters/0/max',
      ]),
    );
  });

  it('serves the seeded demo scenarios under their documented public ids', async () => {
    for (const publicId of ['larchmere-brackenlow-mere', 'larchmere-hobcairn-moor']) {
      const res = await h
        .call('get', `/published-scenarios/${publicId}`, h.demo.browserKey, DEMO_ORIGIN)
        .expect(200);
      expect(res.body.version).toBe(1);
    }
  });

  it('lets members work by role with CSRF: viewers read, analysts save and publish', async () => {
    const { app } = h;
    const viewer = await signInDemo(app, 'viewer');
    const analyst = await signInDemo(app, 'analyst');
    const list = await viewer.agent.get('/api/v1/scenarios').expect(conformsToContract);
    expect(list.status).toBe(200);
    expect(list.body.scenarios.length).toBeGreaterThanOrEqual(3);
    const refused = await viewer.agent
      .post(`/api/v1/scenarios/${id}/versions`)
      .set('X-CSRF-Token', viewer.csrf)
      .send({ ...content, changeNote: 'viewer edit' });
    expect(refused.status).toBe(403);
    const noCsrf = await analyst.agent
      .post(`/api/v1/scenarios/${id}/versions`)
      .send({ ...content, changeNote: 'no token' });
    expect(noCsrf.status).toBe(403);
    const saved = await analyst.agent
      .post(`/api/v1/scenarios/${id}/versions`)
      .set('X-CSRF-Token', analyst.csrf)
      .send({ ...content, changeNote: 'analyst edit' })
      .expect(conformsToContract);
    expect(saved.status).toBe(201);
    expect(saved.body.version.author).toMatch(/^user:/);
    const pub = await analyst.agent
      .post(`/api/v1/scenarios/${id}/versions/${saved.body.version.version}/publish`)
      .set('X-CSRF-Token', analyst.csrf)
      .expect(conformsToContract);
    expect(pub.status).toBe(200);
    const anonymous = await h.call('get', `/scenarios/${id}`).expect(401);
    expect(anonymous.body.type).toMatch(/not-signed-in/);
  });
});
