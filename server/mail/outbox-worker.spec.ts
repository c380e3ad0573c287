import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { DEMO_PLAN } from '../../seeds/02-demo-quota-plan';
import { clockedApp, signInDemo, type ClockedApp } from '../accounts/testing/signed-in-agent';
import { periodOf } from '../quotas/quotas-service';
import { retryDelayMs } from './outbox-worker';

describe('the mail outbox', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());
  const mailer = () => t.app.locals.tropline.accounts.mailer;
  const caught = (to: string) =>
    mailer()
      .catcher!.list()
      .filter((m) => m.to.includes(to));

  it('keeps mail while the SMTP server is down and delivers it once it is back', async () => {
    const catcher = mailer().catcher!;
    await catcher.stop();
    const admin = await signInDemo(t.app, 'admin');
    const to = 'held.back@larchmere.example';
    await admin.agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', admin.csrf)
      .send({ email: to, role: 'viewer' })
      .expect(201);
    // The route started a delivery pass after its commit; this one runs after it.
    await mailer().flush();
    const [waiting] = await mailer().outbox.pending();
    expect(waiting).toMatchObject({ to, attempts: 1, sentAt: null });
    expect(waiting!.lastError).toMatch(/ECONNREFUSED|connect/i);

    await catcher.start();
    // Not due yet: the retry waits its back-off.
    expect(await mailer().flush()).toEqual({ sent: 0, failed: 0 });
    t.advance(retryDelayMs(1));
    expect(await mailer().flush()).toEqual({ sent: 1, failed: 0 });
    expect(await mailer().outbox.pending()).toEqual([]);
    expect(caught(to)).toHaveLength(1);
    expect(await mailer().flush()).toEqual({ sent: 0, failed: 0 }); // sent once, only once
  });

  it('tells owners and admins when a key is issued, rotated or revoked', async () => {
    const owner = await signInDemo(t.app, 'owner');
    const issued = await owner.agent
      .post('/api/v1/console/keys')
      .set('X-CSRF-Token', owner.csrf)
      .send({ kind: 'server', name: 'Nightly report' })
      .expect(201);
    await mailer().flush();
    const notices = mailer()
      .catcher!.list()
      .filter((m) => m.template === 'key-notice');
    expect(notices.map((m) => m.to[0]).sort()).toEqual([
      'maren.oakhollow@larchmere.example',
      'tobias.fenwright@larchmere.example',
    ]);
    expect(notices[0]!.subject).toMatch(/was issued$/);
    expect(notices[0]!.text).toContain(issued.body.key.label);
    expect(notices[0]!.text).toContain('Maren Oakhollow');

    await owner.agent
      .post(`/api/v1/console/keys/${issued.body.key.id}/rotate`)
      .set('X-CSRF-Token', owner.csrf)
      .send({ overlapSeconds: 60 })
      .expect(201);
    await owner.agent
      .delete(`/api/v1/console/keys/${issued.body.key.id}`)
      .set('X-CSRF-Token', owner.csrf)
      .expect(204);
    await mailer().flush();
    const subjects = caught('maren.oakhollow@larchmere.example')
      .filter((m) => m.template === 'key-notice')
      .map((m) => m.subject.replace(/.* was /, ''));
    // One notice per change: the rotation's successor is not announced as a separate issue.
    expect(subjects.sort()).toEqual(['issued', 'revoked', 'rotated']);
  });

  it('alerts at 80 % and 100 % of the month, each once', async () => {
    const db = t.app.locals.tropline.db;
    const period = periodOf(t.app.locals.tropline.now());
    const setUsed = (used: number) =>
      db('usage_counters')
        .insert({ tenant_id: DEMO_TENANT.id, period, used })
        .onConflict(['tenant_id', 'period'])
        .merge();
    const alerts = () =>
      caught('tobias.fenwright@larchmere.example').filter((m) => m.template === 'quota-alert');
    await setUsed(Math.ceil(DEMO_PLAN.monthlyUnits * 0.79));
    await mailer().flush();
    expect(alerts()).toHaveLength(0);
    await setUsed(DEMO_PLAN.monthlyUnits * 0.8);
    await mailer().flush();
    await mailer().flush();
    expect(alerts().map((m) => m.subject)).toEqual([
      'Larchmere Lakes & Uplands Authority (demo) has used 80 % of its compute units',
    ]);
    await setUsed(DEMO_PLAN.monthlyUnits);
    await mailer().flush();
    expect(alerts()).toHaveLength(2);
    expect(alerts()[0]!.subject).toMatch(/used all its compute units/);
    expect(alerts()[0]!.html).toContain('250,000');
  });

  it('serves the development mailbox and 404s an unknown message', async () => {
    const list = await request(t.app).get('/api/v1/dev/mailbox').expect(200);
    expect(list.body.smtpPort).toBe(mailer().catcher!.port);
    const first = list.body.messages.at(-1);
    await request(t.app).get(`/api/v1/dev/mailbox/${first.id}`).expect(200);
    const missing = await request(t.app).get('/api/v1/dev/mailbox/999999').expect(404);
    expect(missing.body.status).toBe(404);
  });
});
