import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { testConfig } from '../config';
import { createApp } from '../create-app';

describe('service routes', () => {
  const app = createApp(testConfig());
  afterAll(() => app.locals.tropline.close());

  it('answers health with the database latency', async () => {
    const res = await request(app).get('/api/v1/health').expect(200);
    expect(res.body.status).toBe('ok');
    expect(res.body.database.latencyMs).toBeGreaterThanOrEqual(0);
  });

  it('migrates and seeds an empty database on first start', async () => {
    const outcome = await app.locals.tropline.ready;
    expect(outcome.seeded).toBe(true);
    expect(outcome.migrated.length).toBeGreaterThan(0);
    const tenants = await app.locals.tropline.db('tenants').select('slug');
    expect(tenants.map((t) => t.slug)).toContain('larchmere');
  });

  it('answers unknown API paths with problem details', async () => {
    const res = await request(app).get('/api/v1/nothing-here').expect(404);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body).toMatchObject({ status: 404, title: 'No such resource' });
    expect(res.body.type).toMatch(/^https:\/\//);
  });

  it('answers malformed JSON with a 400 problem naming the body', async () => {
    const res = await request(app)
      .post('/api/v1/health')
      .set('content-type', 'application/json')
      .send('{"model": ')
      .expect(400);
    expect(res.body.errors[0].pointer).toBe('');
  });

  it('serves the OpenAPI document as JSON and Swagger UI', async () => {
    const json = await request(app).get('/api/openapi.json').expect(200);
    expect(json.body.openapi).toBe('3.1.0');
    const ui = await request(app).get('/api/docs/').expect(200);
    expect(ui.text).toContain('swagger-ui');
  });

  it('sets security headers', async () => {
    const res = await request(app).get('/api/v1/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
