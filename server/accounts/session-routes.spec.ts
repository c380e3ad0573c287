import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ABSOLUTE_TIMEOUT_MS, IDLE_TIMEOUT_MS } from './session-stack';
import {
  clockedApp,
  cookiePair,
  demoUser,
  signInAs,
  signInDemo,
  type ClockedApp,
} from './testing/signed-in-agent';

describe('/session', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());

  it('signs in with a HttpOnly, SameSite=Lax cookie and answers who and where', async () => {
    const admin = demoUser('admin');
    const { session, cookies } = await signInDemo(t.app, 'admin');
    const sid = cookies.find((c) => c.startsWith('tropline.sid='))!;
    expect(sid).toMatch(/HttpOnly/i);
    expect(sid).toMatch(/SameSite=Lax/i);
    expect(sid).not.toMatch(/Secure/i); // Secure only in production
    expect(session).toMatchObject({
      user: { email: admin.email, name: admin.name, operator: false },
      tenants: [{ slug: 'larchmere', role: 'admin' }],
    });
    expect(typeof session.csrfToken).toBe('string');
  });

  it('GET answers the signed-in user, and 401 without a session', async () => {
    const { agent } = await signInDemo(t.app, 'viewer');
    const me = await agent.get('/api/v1/session').expect(200);
    expect(me.body.tenants).toEqual([
      expect.objectContaining({ slug: 'larchmere', role: 'viewer' }),
    ]);
    const anon = await request(t.app).get('/api/v1/session').expect(401);
    expect(anon.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(anon.body.type).toMatch(/not-signed-in$/);
  });

  it('answers a wrong password exactly like an unknown account', async () => {
    const known = await request(t.app)
      .post('/api/v1/session')
      .send({ email: demoUser('owner').email, password: 'not-the-right-one' });
    const unknown = await request(t.app)
      .post('/api/v1/session')
      .send({ email: 'nobody.here@larchmere.example', password: 'not-the-right-one' });
    expect(known.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(known.body);
    expect(unknown.headers['set-cookie']).toBeUndefined();
  });

  it('names the missing field of a malformed sign-in', async () => {
    const res = await request(t.app).post('/api/v1/session').send({ password: 'x' }).expect(400);
    expect(res.body.errors).toEqual([{ pointer: '/email', message: expect.any(String) }]);
  });

  it('regenerates the session on sign-in, so an earlier session id is worthless', async () => {
    const first = await signInDemo(t.app, 'viewer');
    const before = cookiePair(first.cookies, 'tropline.sid')!;
    const analyst = demoUser('analyst');
    const again = await first.agent
      .post('/api/v1/session')
      .send({ email: analyst.email, password: analyst.password })
      .expect(200);
    const after = cookiePair(
      ([] as string[]).concat(again.headers['set-cookie'] ?? []),
      'tropline.sid',
    )!;
    expect(after).not.toBe(before);
    await request(t.app).get('/api/v1/session').set('Cookie', before).expect(401);
    const now = await request(t.app).get('/api/v1/session').set('Cookie', after).expect(200);
    expect(now.body.user.email).toBe(analyst.email);
  });

  it('signs out: the cookie no longer works, replayed or not', async () => {
    const { agent, cookies } = await signInDemo(t.app, 'analyst');
    await agent.delete('/api/v1/session').expect(204);
    await agent.get('/api/v1/session').expect(401);
    const replay = cookiePair(cookies, 'tropline.sid')!;
    await request(t.app).get('/api/v1/session').set('Cookie', replay).expect(401);
  });

  it('signs out everywhere: every other session of the user ends too', async () => {
    const laptop = await signInDemo(t.app, 'owner');
    const phone = await signInDemo(t.app, 'owner');
    await laptop.agent
      .post('/api/v1/session/sign-out-everywhere')
      .set('X-CSRF-Token', laptop.csrf)
      .expect(204);
    await phone.agent.get('/api/v1/session').expect(401);
    await laptop.agent.get('/api/v1/session').expect(401);
    await signInDemo(t.app, 'owner'); // a fresh sign-in still works
  });
});

describe('session expiry', () => {
  it('ends a session after two idle hours', async () => {
    const t = await clockedApp();
    try {
      const { agent } = await signInDemo(t.app, 'viewer');
      t.advance(IDLE_TIMEOUT_MS - 60_000);
      await agent.get('/api/v1/session').expect(200);
      t.advance(IDLE_TIMEOUT_MS + 1);
      const res = await agent.get('/api/v1/session').expect(401);
      expect(res.body.type).toMatch(/session-expired$/);
      await agent.get('/api/v1/session').expect(401);
    } finally {
      await t.close();
    }
  });

  it('ends a busy session twelve hours after sign-in', async () => {
    const t = await clockedApp();
    try {
      const { agent } = await signInDemo(t.app, 'viewer');
      for (let hour = 1; hour < 12; hour++) {
        t.advance(3_600_000);
        await agent.get('/api/v1/members').expect(200);
      }
      t.advance(ABSOLUTE_TIMEOUT_MS - 11 * 3_600_000);
      await agent.get('/api/v1/members').expect(401);
    } finally {
      await t.close();
    }
  });
});

describe('CSRF', () => {
  let t: ClockedApp;
  beforeAll(async () => {
    t = await clockedApp();
  });
  afterAll(() => t.close());
  const invite = { email: 'new.person@larchmere.example', role: 'viewer' };

  it('refuses a forged cross-site change: the cookie alone is not enough', async () => {
    const { agent } = await signInDemo(t.app, 'admin');
    const res = await agent.post('/api/v1/invitations').send(invite).expect(403);
    expect(res.body.type).toMatch(/csrf-refused$/);
    const forged = await agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', 'made-up-by-the-attacker')
      .send(invite)
      .expect(403);
    expect(forged.body.type).toMatch(/csrf-refused$/);
  });

  it("refuses another session's token", async () => {
    const mine = await signInDemo(t.app, 'admin');
    const theirs = await signInDemo(t.app, 'owner');
    await mine.agent
      .post('/api/v1/invitations')
      .set('X-CSRF-Token', theirs.csrf)
      .send(invite)
      .expect(403);
  });

  it('refuses a request from another site even with a token', async () => {
    const { agent, csrf } = await signInDemo(t.app, 'admin');
    const res = await agent
      .post('/api/v1/invitations')
      .set('Origin', 'https://elsewhere.example')
      .set('X-CSRF-Token', csrf)
      .send(invite)
      .expect(403);
    expect(res.body.type).toMatch(/cross-site-refused$/);
    const login = await request(t.app)
      .post('/api/v1/session')
      .set('Origin', 'https://elsewhere.example')
      .send({ email: demoUser('admin').email, password: demoUser('admin').password })
      .expect(403);
    expect(login.body.type).toMatch(/cross-site-refused$/);
  });

  it('accepts the change with the session token from our own origin', async () => {
    const { agent, csrf } = await signInDemo(t.app, 'admin');
    await agent
      .post('/api/v1/invitations')
      .set('Origin', 'http://tropline.test')
      .set('X-CSRF-Token', csrf)
      .send(invite)
      .expect(201);
    const me = await agent.get('/api/v1/session').expect(200);
    expect(me.body.csrfToken).toBe(csrf); // reused, so other tabs keep working
  });
});

describe('sign-in throttling', () => {
  it('locks an account after five failures, answering unknown accounts alike', async () => {
    const t = await clockedApp();
    try {
      const owner = demoUser('owner');
      const ghost = 'ghost.account@larchmere.example';
      for (let i = 0; i < 5; i++) {
        for (const email of [owner.email, ghost]) {
          await request(t.app)
            .post('/api/v1/session')
            .send({ email, password: 'wrong-guess-' + i })
            .expect(401);
        }
      }
      const locked = await request(t.app)
        .post('/api/v1/session')
        .send({ email: owner.email, password: owner.password })
        .expect(429);
      const lockedGhost = await request(t.app)
        .post('/api/v1/session')
        .send({ email: ghost, password: owner.password })
        .expect(429);
      expect(locked.body.detail).toMatch(/Too many failed sign-ins/);
      expect(lockedGhost.body.title).toBe(locked.body.title);
      expect(Number(locked.headers['retry-after'])).toBeGreaterThan(0);
      // Other accounts are unaffected; the lock lifts when the window has passed.
      await signInDemo(t.app, 'viewer');
      t.advance(15 * 60_000 + 1000);
      await signInAs(t.app, owner.email, owner.password);
    } finally {
      await t.close();
    }
  });

  it('locks an address that guesses across many accounts', async () => {
    const t = await clockedApp();
    try {
      for (let i = 0; i < 30; i++) {
        await request(t.app)
          .post('/api/v1/session')
          .send({ email: `guess${i}@larchmere.example`, password: 'wrong-guess' })
          .expect(401);
      }
      const viewer = demoUser('viewer');
      await request(t.app)
        .post('/api/v1/session')
        .send({ email: viewer.email, password: viewer.password })
        .expect(429);
    } finally {
      await t.close();
    }
  });
});
