import request from 'supertest';
import { afterAll, beforeAll, describe, it } from 'vitest';
import { conformsToContract } from '../../tests/api/openapi-contract';
import { clockedApp, signInDemo, tokenFromMail, type ClockedApp } from './testing/signed-in-agent';

describe('console answers match openapi/openapi.yaml', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());

  it('for sessions, members, invitations, resets, audit, keys, platform and the mailbox', async () => {
    const c = conformsToContract;
    await request(t.app).get('/api/v1/session').expect(401).expect(c);
    await request(t.app)
      .post('/api/v1/session')
      .send({ email: 'nobody@larchmere.example', password: 'not-a-password' })
      .expect(401)
      .expect(c);
    await request(t.app).post('/api/v1/session').send({}).expect(400).expect(c);
    const owner = await signInDemo(t.app, 'owner');
    const { agent, csrf } = owner;
    await agent.get('/api/v1/session').expect(200).expect(c);
    const members = await agent.get('/api/v1/members').expect(200).expect(c);
    const viewer = members.body.members.find((m: { role: string }) => m.role === 'viewer');
    await agent
      .patch(`/api/v1/members/${viewer.userId}`)
      .set('X-CSRF-Token', csrf)
      .send({ role: 'analyst' })
      .expect(200)
      .expect(c);
    await agent.patch(`/api/v1/members/${viewer.userId}`).send({ role: 'viewer' }).expect(403);
    await agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', csrf)
      .send({ email: 'contract.check@larchmere.example', role: 'viewer' })
      .expect(201)
      .expect(c);
    await agent.get('/api/v1/invitations').expect(200).expect(c);
    await t.app.locals.tropline.accounts.mailer.flush();
    const box = await request(t.app)
      .get('/api/v1/dev/mailbox')
      .query({ to: 'contract.check@larchmere.example' })
      .expect(200)
      .expect(c);
    await request(t.app)
      .get(`/api/v1/dev/mailbox/${box.body.messages[0].id}`)
      .expect(200)
      .expect(c);
    const token = tokenFromMail(box.body.messages[0].text);
    await request(t.app).post('/api/v1/invitations/lookup').send({ token }).expect(200).expect(c);
    await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, name: 'Contract Check', password: 'a-long-enough-phrase' })
      .expect(200)
      .expect(c);
    await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, password: 'a-long-enough-phrase' })
      .expect(410)
      .expect(c);
    await request(t.app)
      .post('/api/v1/password-resets')
      .send({ email: 'contract.check@larchmere.example' })
      .expect(202)
      .expect(c);
    await agent.get('/api/v1/audit-events').query({ limit: 3 }).expect(200).expect(c);
    const issued = await agent
      .post('/api/v1/console/keys')
      .set('X-CSRF-Token', csrf)
      .send({ kind: 'browser', origins: ['https://portal.larchmere.example'] })
      .expect(201)
      .expect(c);
    await agent.get('/api/v1/console/keys').expect(200).expect(c);
    await agent
      .post(`/api/v1/console/keys/${issued.body.key.id}/rotate`)
      .set('X-CSRF-Token', csrf)
      .send({})
      .expect(201)
      .expect(c);
    const operator = await signInDemo(t.app, 'operator');
    await operator.agent
      .post('/api/v1/tenants')
      .set('X-CSRF-Token', operator.csrf)
      .send({ slug: 'fenwick', name: 'Fenwick Basin Trust' })
      .expect(201)
      .expect(c);
    await operator.agent
      .put('/api/v1/tenants/fenwick/plan')
      .set('X-CSRF-Token', operator.csrf)
      .send({ monthlyUnits: 500_000 })
      .expect(200)
      .expect(c);
    await agent.delete('/api/v1/session').expect(204).expect(c);
  });
});
