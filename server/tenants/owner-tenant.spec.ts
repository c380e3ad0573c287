import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conformsToContract as c } from '../../tests/api/openapi-contract';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import {
  clockedApp,
  signInDemo,
  type ClockedApp,
  type SignedInAgent,
} from '../accounts/testing/signed-in-agent';
import { KeysService } from '../keys/keys-service';
import { periodOf } from '../quotas/quotas-service';

describe("an owner's tenant and plan", () => {
  let t: ClockedApp;
  let owner: SignedInAgent;
  let operator: SignedInAgent;
  beforeAll(async () => {
    t = await clockedApp();
    owner = await signInDemo(t.app, 'owner');
    operator = await signInDemo(t.app, 'operator');
  });
  afterAll(() => t.close());

  const db = () => t.app.locals.tropline.db;
  const mailer = () => t.app.locals.tropline.accounts.mailer;
  const events = () => db()('audit_events').orderBy('id');
  /** Runs `act` and returns the audit events it wrote. */
  async function eventsOf(act: () => Promise<unknown>) {
    const before = (await events()).length;
    await act();
    return (await events()).slice(before);
  }
  const send = (a: SignedInAgent, method: 'post' | 'patch' | 'put', path: string, body: object) =>
    a.agent[method](`/api/v1${path}`).set('X-CSRF-Token', a.csrf).send(body);
  const setUsed = (used: number) =>
    db()('usage_counters')
      .insert({ tenant_id: DEMO_TENANT.id, period: periodOf(t.app.locals.tropline.now()), used })
      .onConflict(['tenant_id', 'period'])
      .merge();
  const alertsTo = (to: string) =>
    mailer()
      .catcher!.list()
      .filter((m) => m.to.includes(to) && m.template === 'quota-alert');

  it('reads and changes the name and contact address, one audit event per change', async () => {
    const read = await owner.agent.get('/api/v1/tenant').expect(200).expect(c);
    expect(read.body).toMatchObject({ slug: 'larchmere', name: DEMO_TENANT.name });
    expect(read.body.contactEmail).toBeNull();

    const renamed = await eventsOf(() =>
      send(owner, 'patch', '/tenant', {
        name: '  Larchmere Lakes Authority (demo)  ',
        contactEmail: 'Quota.Desk@Larchmere.example',
      })
        .expect(200)
        .expect(c),
    );
    expect(renamed.map((e) => [e.action, e.actor, JSON.parse(e.detail)])).toEqual([
      [
        'tenant.update',
        `user:${owner.session.user.id}`,
        {
          name: { from: DEMO_TENANT.name, to: 'Larchmere Lakes Authority (demo)' },
          contactEmail: { from: null, to: 'quota.desk@larchmere.example' },
        },
      ],
    ]);
    expect(renamed[0].address).toMatch(/127\.0\.0\.1|::1/);
    // Every member's session names the tenant anew on the next request.
    const session = await owner.agent.get('/api/v1/session').expect(200);
    expect(session.body.tenants[0].name).toBe('Larchmere Lakes Authority (demo)');

    const same = await eventsOf(() =>
      send(owner, 'patch', '/tenant', { name: 'Larchmere Lakes Authority (demo)' }).expect(200),
    );
    expect(same).toEqual([]);
    for (const [body, pointer] of [
      [{}, ''],
      [{ contactEmail: 'quota desk' }, '/contactEmail'],
      [{ name: '   ' }, '/name'],
      [{ plan: 'catchment' }, '/plan'],
    ] as const) {
      const bad = await send(owner, 'patch', '/tenant', body).expect(400).expect(c);
      expect(bad.body.errors[0].pointer, JSON.stringify(body)).toBe(pointer);
    }
    const forged = await owner.agent.patch('/api/v1/tenant').send({ name: 'Forged' }).expect(403);
    expect(forged.body.type).toMatch(/csrf-refused$/);
    const admin = await signInDemo(t.app, 'admin');
    const refused = await admin.agent.get('/api/v1/tenant').expect(403).expect(c);
    expect(refused.body.type).toMatch(/role-forbidden$/);

    const restored = await eventsOf(() =>
      send(owner, 'patch', '/tenant', { name: DEMO_TENANT.name }).expect(200),
    );
    expect(restored.map((e) => e.action)).toEqual(['tenant.update']);
    expect((await db()('audit_events').where({ action: 'tenant.update' })).length).toBe(2);
  });

  it('moves to a plan on offer at once; the month’s units carry over; no plan below them', async () => {
    await setUsed(30_000);
    const plan = await owner.agent.get('/api/v1/tenant/plan').expect(200).expect(c);
    expect(plan.body.current).toMatchObject({
      offer: { id: 'authority', name: 'Authority' },
      monthlyUnits: 250_000,
    });
    expect(plan.body.usage).toMatchObject({ period: '2026-12', used: 30_000 });
    expect(plan.body.offers.map((o: { id: string }) => o.id)).toEqual([
      'field-station',
      'survey',
      'authority',
      'catchment',
    ]);
    const fits = plan.body.offers.map((o: { fitsThisMonth: boolean }) => o.fitsThisMonth);
    expect(fits).toEqual([false, true, true, true]);

    const moved = await eventsOf(() =>
      send(owner, 'put', '/tenant/plan', { offer: 'catchment' }).expect(200).expect(c),
    );
    expect(moved.map((e) => [e.action, e.target, JSON.parse(e.detail)])).toEqual([
      [
        'quota.plan-change',
        'plan:catchment',
        {
          from: {
            offer: 'authority',
            monthlyUnits: 250_000,
            perMinute: 1200,
            browserPerMinute: 120,
          },
          to: {
            offer: 'catchment',
            monthlyUnits: 1_000_000,
            perMinute: 3000,
            browserPerMinute: 300,
          },
          usedThisMonth: 30_000,
        },
      ],
    ]);
    // The very next keyed request works within the new plan, with this month's units counted.
    const { token } = await new KeysService(db()).issue(
      { tenantId: DEMO_TENANT.id, kind: 'server', scopes: ['usage:read'] },
      'test',
    );
    const usage = await request(t.app)
      .get('/api/v1/usage')
      .set('Authorization', `Bearer ${token}`)
      .expect(200);
    expect(usage.body).toMatchObject({ used: 30_000, limit: 1_000_000, perMinute: 3000 });
    expect(usage.headers['ratelimit-policy']).toContain('"monthly-units";q=1000000');

    const again = await eventsOf(() =>
      send(owner, 'put', '/tenant/plan', { offer: 'catchment' }).expect(200),
    );
    expect(again).toEqual([]);
    const below = await eventsOf(async () => {
      const res = await send(owner, 'put', '/tenant/plan', { offer: 'field-station' })
        .expect(409)
        .expect(c);
      expect(res.body.type).toMatch(/plan-below-usage$/);
      expect(res.body.errors[0].pointer).toBe('/offer');
      expect(res.body).toMatchObject({ used: 30_000, allowed: 25_000 });
    });
    expect(below).toEqual([]);
    for (const body of [{ offer: 'no-such-plan' }, {}, { offer: 'Catchment!' }]) {
      const bad = await send(owner, 'put', '/tenant/plan', body).expect(400).expect(c);
      expect(bad.body.errors[0].pointer, JSON.stringify(body)).toBe('/offer');
    }
    const after = await owner.agent.get('/api/v1/tenant/plan').expect(200);
    expect(after.body.current.offer.id).toBe('catchment');
  });

  it('re-arms quota alerts the new plan is below, and mails the contact address too', async () => {
    const contact = 'quota.watch@larchmere.example';
    await send(owner, 'patch', '/tenant', { contactEmail: contact }).expect(200);
    await send(owner, 'put', '/tenant/plan', { offer: 'authority' }).expect(200);
    await setUsed(210_000); // 84 % of Authority's 250 000
    await mailer().flush();
    expect(alertsTo(contact).map((m) => m.subject)).toEqual([
      'Larchmere Lakes & Uplands Authority (demo) has used 80 % of its compute units',
    ]);
    expect(alertsTo(contact)[0]!.text).toContain('this address is the contact for');
    expect(alertsTo('tobias.fenwright@larchmere.example')).toHaveLength(1);

    // 21 % of Catchment: the 80 % alert is forgotten, and sent again back on Authority.
    await send(owner, 'put', '/tenant/plan', { offer: 'catchment' }).expect(200);
    expect(await db()('quota_alerts').where({ tenant_id: DEMO_TENANT.id })).toEqual([]);
    await mailer().flush();
    expect(alertsTo(contact)).toHaveLength(1);
    await send(owner, 'put', '/tenant/plan', { offer: 'authority' }).expect(200);
    await mailer().flush();
    expect(alertsTo(contact)).toHaveLength(2);
    await send(owner, 'patch', '/tenant', { contactEmail: null }).expect(200);
    await setUsed(0);
  });

  it('offers only what the operator offers; a withdrawn plan stays with its tenants', async () => {
    const offer = {
      id: 'reedbed',
      name: 'Reedbed',
      description: 'A season of monitoring on one lake.',
      monthlyUnits: 40_000,
      perMinute: 400,
      browserPerMinute: 40,
    };
    const created = await eventsOf(() =>
      send(operator, 'post', '/plan-offers', offer).expect(201).expect(c),
    );
    expect(created.map((e) => [e.action, e.tenant_id, e.target])).toEqual([
      ['plan-offer.create', null, 'plan:reedbed'],
    ]);
    const taken = await send(operator, 'post', '/plan-offers', offer).expect(409).expect(c);
    expect(taken.body.errors[0].pointer).toBe('/id');
    for (const [body, pointer] of [
      [{ ...offer, id: 'other', perMinute: 0 }, '/perMinute'],
      [{ ...offer, id: 'other', monthlyUnits: 1.5 }, '/monthlyUnits'],
      [{ ...offer, id: 'Not A Slug' }, '/id'],
    ] as const) {
      const bad = await send(operator, 'post', '/plan-offers', body).expect(400).expect(c);
      expect(bad.body.errors[0].pointer).toBe(pointer);
    }
    await send(owner, 'post', '/plan-offers', { ...offer, id: 'mine' })
      .expect(403)
      .expect(c);

    await send(owner, 'put', '/tenant/plan', { offer: 'reedbed' }).expect(200);
    const withdrawn = await eventsOf(() =>
      send(operator, 'patch', '/plan-offers/reedbed', { available: false }).expect(200).expect(c),
    );
    expect(withdrawn.map((e) => [e.action, JSON.parse(e.detail)])).toEqual([
      ['plan-offer.update', { available: { from: true, to: false } }],
    ]);
    const numbers = await send(operator, 'patch', '/plan-offers/reedbed', { monthlyUnits: 1 })
      .expect(400)
      .expect(c);
    expect(numbers.body.errors[0].message).toMatch(/monthlyUnits/);
    await send(operator, 'patch', '/plan-offers/no-such', { available: true }).expect(404);

    const mine = await owner.agent.get('/api/v1/tenant/plan').expect(200);
    expect(mine.body.current.offer).toEqual({ id: 'reedbed', name: 'Reedbed' });
    expect(mine.body.offers.map((o: { id: string }) => o.id)).not.toContain('reedbed');
    const catalogue = await operator.agent.get('/api/v1/plan-offers').expect(200).expect(c);
    expect(catalogue.body.offers.find((o: { id: string }) => o.id === 'reedbed')).toMatchObject({
      available: false,
      tenants: 1,
    });
    // Having left it, the owner cannot come back to a withdrawn plan.
    await send(owner, 'put', '/tenant/plan', { offer: 'survey' }).expect(200);
    const gone = await send(owner, 'put', '/tenant/plan', { offer: 'reedbed' }).expect(400);
    expect(gone.body.errors[0].pointer).toBe('/offer');

    // Numbers the operator sets directly belong to no offer.
    await send(operator, 'put', '/tenants/larchmere/plan', { monthlyUnits: 123_456 }).expect(200);
    const custom = await owner.agent.get('/api/v1/tenant/plan').expect(200).expect(c);
    expect(custom.body.current).toMatchObject({ offer: null, monthlyUnits: 123_456 });
    expect(custom.body.offers.some((o: { current: boolean }) => o.current)).toBe(false);
  });
});
