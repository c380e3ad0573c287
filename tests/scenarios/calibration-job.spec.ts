import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInDemo } from '../../server/accounts/testing/signed-in-agent';
import { DEMO_SCENARIOS } from '../../seeds/05-demo-scenarios';
import { startHarness, type Harness } from '../api/api-harness';
import { conformsToContract } from '../api/openapi-contract';
import { MOOR_FIT } from './fit-requests';

// The seeded Hobcairn Moor scenario and its synthetic dataset (seed 8102, log-normal σ = 0.15):
// the truth is the scenario's own model (UPLAND_DEMO), which settles, so it is not chaotic.
const MOOR = DEMO_SCENARIOS[1]!;
const TRUTH: Record<string, number> = { '/levels/1/attackRate': 0.08, '/levels/1/mortality': 0.3 };
describe('calibration as a job over HTTP', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  /** Follows a calibration until it finishes (each poll yields to the worker thread). */
  async function finished(id: string) {
    for (let i = 0; i < 600; i++) {
      const res = await h.call('get', `/calibrations/${id}`, h.demo.serverKey).expect(200);
      if (res.body.status === 'succeeded' || res.body.status === 'failed') return res.body;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    throw new Error(`calibration ${id} did not finish`);
  }

  it('refuses bad fit requests with pointers before any work', async () => {
    const res = await h
      .call('post', `/scenarios/${MOOR.id}/calibrations`, h.demo.serverKey)
      .send({ dataset: 1, parameters: [{ pointer: '/levels/5/mortality', min: 0, max: 1 }] })
      .expect(400);
    expect(res.body.errors[0].pointer).toBe('/parameters/0/pointer');
    const missing = await h
      .call('post', `/scenarios/${MOOR.id}/calibrations`, h.demo.serverKey)
      .send({ parameters: [] })
      .expect(400);
    expect(missing.body.errors[0].pointer).toBe('/dataset');
  });

  it('recovers the truth within the reported standard errors and saves it as a version', async () => {
    const created = await h
      .call('post', `/scenarios/${MOOR.id}/calibrations`, h.demo.serverKey)
      .send(MOOR_FIT)
      .expect(202);
    expect(created.headers.location).toBe(`/api/v1/calibrations/${created.body.id}`);
    const job = await finished(created.body.id);
    expect(job.status, JSON.stringify(job.error)).toBe('succeeded');
    expect(job.progress).toBe(1);
    const result = job.result;
    expect(result.chaotic).toBe(false);
    for (const e of result.estimates) {
      expect(Math.abs(e.value - TRUTH[e.pointer]!), e.pointer).toBeLessThan(2 * e.standardError);
    }
    expect(result.residuals.length).toBe(result.fit.points);
    expect(result.trajectory[0].times.length).toBe(101);

    // A member reads the same job through the session, and saves the fit as a new version.
    const analyst = await signInDemo(h.app, 'analyst');
    const read = await analyst.agent
      .get(`/api/v1/calibrations/${created.body.id}`)
      .expect(conformsToContract);
    expect(read.body.result.estimates).toEqual(result.estimates);
    const saved = await analyst.agent
      .post(`/api/v1/calibrations/${created.body.id}/versions`)
      .set('X-CSRF-Token', analyst.csrf)
      .send({})
      .expect(conformsToContract);
    expect(saved.status).toBe(201);
    expect(saved.body.version.changeNote).toMatch(/Calibrated to dataset version 1/);
    const cmp = await h
      .call(
        'get',
        `/scenarios/${MOOR.id}/comparison?from=1&to=${saved.body.version.version}`,
        h.demo.serverKey,
      )
      .expect(200);
    expect(cmp.body.changes.map((c: { pointer: string }) => c.pointer)).toEqual([
      '/model/levels/1/attackRate',
      '/model/levels/1/mortality',
    ]);
  });

  it('keeps the public ranges only when they hold the fitted values, else asks for new ones', async () => {
    const v1 = await h.call('get', `/scenarios/${MOOR.id}/versions/1`, h.demo.serverKey);
    const content = structuredClone(v1.body.content);
    content.model.levels[1].attackRate = 0.1;
    content.publicParameters = [{ pointer: '/levels/1/attackRate', min: 0.09, max: 0.2 }];
    const draft = await h
      .call('post', `/scenarios/${MOOR.id}/versions`, h.demo.serverKey)
      .send({ ...content, changeNote: 'Public attack rate from 0.09' })
      .expect(201);
    const created = await h
      .call('post', `/scenarios/${MOOR.id}/calibrations`, h.demo.serverKey)
      .send({
        dataset: 1,
        scenarioVersion: draft.body.version.version,
        parameters: [{ pointer: '/levels/1/attackRate', min: 0.01, max: 1 }],
        starts: 1,
      })
      .expect(202);
    const job = await finished(created.body.id);
    expect(job.status, JSON.stringify(job.error)).toBe('succeeded');
    // The truth is 0.08, outside the range [0.09, 0.2] the draft lets the public use.
    expect(job.result.estimates[0].value).toBeLessThan(0.09);
    const refused = await h
      .call('post', `/calibrations/${created.body.id}/versions`, h.demo.serverKey)
      .send({})
      .expect(400);
    expect(refused.body.errors[0].pointer).toBe('/publicParameters/0/min');
    expect(refused.body.errors[0].message).toMatch(/fitted model.*send publicParameters/);
    const ranges = [{ pointer: '/levels/1/attackRate', min: 0.05, max: 0.2 }];
    const saved = await h
      .call('post', `/calibrations/${created.body.id}/versions`, h.demo.serverKey)
      .send({ publicParameters: ranges })
      .expect(201);
    const stored = await h
      .call('get', `/scenarios/${MOOR.id}/versions/${saved.body.version.version}`, h.demo.serverKey)
      .expect(200);
    expect(stored.body.content.publicParameters).toEqual(ranges);
    expect(stored.body.content.model.levels[1].attackRate).toBe(job.result.estimates[0].value);
  });
});
