import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  clockedApp,
  signInAs,
  signInDemo,
  tokenFromMail,
  type ClockedApp,
} from '../accounts/testing/signed-in-agent';
import { INVITATION_TTL_MS } from '../accounts/invitations-service';
import { DEVELOPMENT_MAIL_FROM } from '../config';

describe('invitations through the local SMTP catcher', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());
  const mailbox = (to: string) => request(t.app).get('/api/v1/dev/mailbox').query({ to });

  async function invite(email: string, role = 'analyst') {
    const admin = await signInDemo(t.app, 'admin');
    await admin.agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', admin.csrf)
      .send({ email, role })
      .expect(201);
    await t.app.locals.tropline.accounts.mailer.flush();
    const box = await mailbox(email).expect(200);
    expect(box.body.messages).toHaveLength(1);
    return box.body.messages[0];
  }

  it('arrives over SMTP with text and HTML parts, and its link works once', async () => {
    const mail = await invite('wren.ashdown@larchmere.example');
    expect(mail.to).toEqual(['wren.ashdown@larchmere.example']);
    // The sender is the configured MAIL_FROM (here its development default), as sent.
    expect(mail.from).toBe(DEVELOPMENT_MAIL_FROM);
    expect(mail.subject).toBe('Join Larchmere Lakes & Uplands Authority (demo) on Tropline');
    expect(mail.text).toContain('Tobias Fenwright has invited you');
    expect(mail.html).toContain('Larchmere Lakes &amp; Uplands Authority (demo)');
    expect(mail.template).toBe('invitation');
    const link = /http:\/\/tropline\.test\/console\/invitation\?token=\S+/.exec(mail.text)![0];
    expect(mail.html).toContain(link);
    const token = tokenFromMail(mail.text);

    const preview = await request(t.app)
      .post('/api/v1/invitations/lookup')
      .send({ token })
      .expect(200);
    expect(preview.body).toMatchObject({
      tenant: { slug: 'larchmere' },
      role: 'analyst',
      accountExists: false,
    });
    const accepted = await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, name: 'Wren Ashdown', password: 'reed-warbler-at-dusk' })
      .expect(200);
    expect(accepted.body).toMatchObject({ tenant: 'larchmere', role: 'analyst' });

    const again = await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, name: 'Someone Else', password: 'another-long-password' })
      .expect(410);
    expect(again.body.type).toMatch(/invitation-unusable$/);
    await request(t.app).post('/api/v1/invitations/lookup').send({ token }).expect(410);

    const wren = await signInAs(t.app, 'wren.ashdown@larchmere.example', 'reed-warbler-at-dusk');
    expect(wren.session.tenants).toEqual([expect.objectContaining({ role: 'analyst' })]);
  });

  it('expires after seven days', async () => {
    const mail = await invite('late.reader@larchmere.example', 'viewer');
    t.advance(INVITATION_TTL_MS + 1000);
    await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token: tokenFromMail(mail.text), name: 'Late', password: 'finally-got-round-to-it' })
      .expect(410);
  });

  it('refuses a password the policy rejects, naming the field, and keeps the link', async () => {
    const mail = await invite('pat.linden@larchmere.example', 'viewer');
    const token = tokenFromMail(mail.text);
    const weak = await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, name: 'Pat Linden', password: 'password1234' })
      .expect(400);
    expect(weak.body.errors).toEqual([{ pointer: '/password', message: expect.any(String) }]);
    await request(t.app)
      .post('/api/v1/invitations/accept')
      .send({ token, name: 'Pat Linden', password: 'lichen-on-granite-7' })
      .expect(200);
  });

  it('does not let an admin invite an owner', async () => {
    const admin = await signInDemo(t.app, 'admin');
    const res = await admin.agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', admin.csrf)
      .send({ email: 'would.be.owner@larchmere.example', role: 'owner' })
      .expect(403);
    expect(res.body.errors[0].pointer).toBe('/role');
  });
});
