import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { SCENARIO_CONTENT } from '../../tests/reliability/crash-load';
import {
  clockedApp,
  demoUser,
  signInDemo,
  type ClockedApp,
  type SignedInAgent,
} from './testing/signed-in-agent';

describe('the audit trail', () => {
  let t: ClockedApp;
  let owner: SignedInAgent;
  let operator: SignedInAgent;
  beforeAll(async () => {
    t = await clockedApp();
    owner = await signInDemo(t.app, 'owner');
    operator = await signInDemo(t.app, 'operator');
  });
  afterAll(() => t.close());

  const all = () => t.app.locals.tropline.db('audit_events').orderBy('id');

  /** Runs `act` and returns the events it wrote. */
  async function eventsOf(act: () => Promise<unknown>) {
    const before = (await all()).length;
    await act();
    return (await all()).slice(before);
  }

  const send = (a: SignedInAgent, method: 'post' | 'patch' | 'put' | 'delete', path: string) =>
    a.agent[method](`/api/v1${path}`).set('X-CSRF-Token', a.csrf);

  it('writes exactly one event for each security-relevant action', async () => {
    const viewer = demoUser('viewer');
    const cases: [string, () => Promise<unknown>][] = [
      ['session.sign-in', () => signInDemo(t.app, 'analyst')],
      [
        'session.sign-in-failed',
        () =>
          request(t.app)
            .post('/api/v1/session')
            .send({ email: viewer.email, password: 'wrong-password-here' })
            .expect(401),
      ],
      [
        'member.invite',
        () =>
          send(owner, 'post', '/invitations')
            .send({ email: 'one.event@larchmere.example', role: 'viewer' })
            .expect(201),
      ],
      ['quota.set', () => send(operator, 'put', '/tenants/larchmere/plan').send({}).expect(200)],
      [
        'tenant.create',
        () =>
          send(operator, 'post', '/tenants')
            .send({ slug: 'one-event', name: 'One Event Basin' })
            .expect(201),
      ],
      [
        'quota.plan-change',
        () => send(owner, 'put', '/tenant/plan').send({ offer: 'catchment' }).expect(200),
      ],
      [
        'tenant.update',
        () =>
          send(owner, 'patch', '/tenant').send({ contactEmail: null, name: 'Renamed' }).expect(200),
      ],
    ];
    for (const [action, act] of cases) {
      const written = await eventsOf(act);
      expect(written.map((e) => e.action)).toEqual([action]);
      expect(written[0].address, action).toMatch(/127\.0\.0\.1|::1/);
    }
    await send(owner, 'patch', '/tenant').send({ name: DEMO_TENANT.name }).expect(200);

    // A signed-in analyst publishes a first version through the console session.
    const analyst = await signInDemo(t.app, 'analyst');
    const saved = await send(analyst, 'post', '/scenarios')
      .send({ ...SCENARIO_CONTENT, changeNote: 'Audit check' })
      .expect(201);
    const scenarioId = saved.body.scenario.id as string;
    const published = await eventsOf(() =>
      send(analyst, 'post', `/scenarios/${scenarioId}/versions/1/publish`).expect(200),
    );
    expect(published.map((e) => [e.action, e.actor, e.target])).toEqual([
      ['scenario.published', `user:${analyst.session.user.id}`, `scenario:${scenarioId}`],
    ]);

    const members = await owner.agent.get('/api/v1/members').expect(200);
    const viewerId = members.body.members.find((m: { email: string }) => m.email === viewer.email)
      .userId as string;
    const changed = await eventsOf(() =>
      send(owner, 'patch', `/members/${viewerId}`).send({ role: 'analyst' }).expect(200),
    );
    expect(changed.map((e) => [e.action, JSON.parse(e.detail)])).toEqual([
      ['member.role-change', { from: 'viewer', to: 'analyst' }],
    ]);
    const removed = await eventsOf(() => send(owner, 'delete', `/members/${viewerId}`).expect(204));
    expect(removed.map((e) => e.action)).toEqual(['member.remove']);

    let keyId = '';
    const issued = await eventsOf(async () => {
      const res = await send(owner, 'post', '/console/keys').send({ kind: 'server' }).expect(201);
      keyId = res.body.key.id;
    });
    expect(issued.map((e) => [e.action, e.actor])).toEqual([
      ['key.issue', `user:${owner.session.user.id}`],
    ]);
    const rotated = await eventsOf(() =>
      send(owner, 'post', `/console/keys/${keyId}/rotate`).send({}).expect(201),
    );
    expect(rotated.map((e) => e.action)).toEqual(['key.rotate']);
    // Key events carry the address of the request that caused them, like every other event.
    expect(issued[0]!.address).toBeTruthy();
    expect(rotated[0]!.address).toBe(issued[0]!.address);
    const revoked = await eventsOf(() =>
      send(owner, 'delete', `/console/keys/${keyId}`).expect(204),
    );
    expect(revoked.map((e) => e.action)).toEqual(['key.revoke']);
  });

  it('lets admins read the trail, filtered and paged, with members’ sign-ins', async () => {
    const admin = await signInDemo(t.app, 'admin');
    const page1 = await admin.agent
      .get('/api/v1/audit-events')
      .query({ action: 'session.sign-in', limit: 2 })
      .expect(200);
    expect(page1.body.events).toHaveLength(2);
    expect(page1.body.events.map((e: { action: string }) => e.action)).toEqual([
      'session.sign-in',
      'session.sign-in',
    ]);
    expect(page1.body.next).toBe(page1.body.events[1].id);
    const page2 = await admin.agent
      .get('/api/v1/audit-events')
      .query({ action: 'session.sign-in', limit: 2, before: page1.body.next })
      .expect(200);
    expect(page2.body.events[0].id).toBeLessThan(page1.body.next);
    // The operator signed in too, but is no member: not part of this tenant's trail.
    const actors = [...page1.body.events, ...page2.body.events].map((e) => e.actor);
    expect(actors).not.toContain(`user:${operator.session.user.id}`);
    const bad = await admin.agent.get('/api/v1/audit-events').query({ limit: 0 }).expect(400);
    expect(bad.body.errors[0].pointer).toBe('/limit');
  });

  it('cannot be changed by any route', async () => {
    const before = await all();
    const id = before[0].id;
    for (const method of ['post', 'put', 'patch', 'delete'] as const) {
      for (const path of ['/audit-events', `/audit-events/${id}`]) {
        const res = await send(owner, method, path).send({ action: 'nothing.happened' });
        expect(res.status).toBe(405);
        expect(res.headers.allow).toBe('GET');
      }
    }
    expect(await all()).toEqual(before);
  });
});
