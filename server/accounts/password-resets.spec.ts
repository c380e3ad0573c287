import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RESET_TTL_MS } from './password-resets-service';
import {
  clockedApp,
  demoUser,
  signInAs,
  signInDemo,
  tokenFromMail,
  type ClockedApp,
} from './testing/signed-in-agent';

describe('password resets', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());

  async function resetMail(email: string) {
    await request(t.app).post('/api/v1/password-resets').send({ email }).expect(202);
    await t.app.locals.tropline.accounts.mailer.flush();
    const box = await request(t.app).get('/api/v1/dev/mailbox').query({ to: email });
    return box.body.messages[0] as { subject: string; text: string; html: string } | undefined;
  }

  it('answers alike for unknown addresses and mails nothing to them', async () => {
    const known = await request(t.app)
      .post('/api/v1/password-resets')
      .send({ email: demoUser('analyst').email })
      .expect(202);
    const unknown = await request(t.app)
      .post('/api/v1/password-resets')
      .send({ email: 'no.account@larchmere.example' })
      .expect(202);
    expect(unknown.body).toEqual(known.body);
    expect(await resetMail('no.account@larchmere.example')).toBeUndefined();
  });

  it('sets a new password once and ends every session of the account', async () => {
    const viewer = demoUser('viewer');
    const desk = await signInDemo(t.app, 'viewer');
    const phone = await signInDemo(t.app, 'viewer');
    const mail = (await resetMail(viewer.email))!;
    expect(mail.subject).toBe('Choose a new Tropline password');
    expect(mail.html).toContain('Choose a new password');
    const token = tokenFromMail(mail.text);
    await request(t.app)
      .post('/api/v1/password-resets/complete')
      .send({ token, password: 'otters-in-the-millrace' })
      .expect(204);
    await desk.agent.get('/api/v1/session').expect(401);
    await phone.agent.get('/api/v1/session').expect(401);
    await request(t.app)
      .post('/api/v1/session')
      .send({ email: viewer.email, password: viewer.password })
      .expect(401);
    await signInAs(t.app, viewer.email, 'otters-in-the-millrace');
    const reuse = await request(t.app)
      .post('/api/v1/password-resets/complete')
      .send({ token, password: 'a-second-new-password' })
      .expect(410);
    expect(reuse.body.type).toMatch(/reset-unusable$/);
  });

  it('expires after thirty minutes', async () => {
    const mail = (await resetMail(demoUser('owner').email))!;
    t.advance(RESET_TTL_MS + 1000);
    await request(t.app)
      .post('/api/v1/password-resets/complete')
      .send({ token: tokenFromMail(mail.text), password: 'too-late-for-this-one' })
      .expect(410);
  });

  it('names the field of a bad request', async () => {
    const res = await request(t.app)
      .post('/api/v1/password-resets')
      .send({ email: 'not an address' })
      .expect(400);
    expect(res.body.errors).toEqual([{ pointer: '/email', message: expect.any(String) }]);
  });
});
