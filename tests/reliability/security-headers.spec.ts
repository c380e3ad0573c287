import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashCostFor, PasswordHasher } from '../../server/accounts/password-hasher';
import { UsersService } from '../../server/accounts/users-service';
import { loadConfig } from '../../server/config';
import { createApp, type TroplineApp } from '../../server/create-app';
import { KeysService } from '../../server/keys/keys-service';
import { TenantsService } from '../../server/tenants/tenants-service';
import { freshDatabaseFile } from './live-server';

// server/accounts/session-routes.spec.ts checks cookies, CSRF and throttling in development;
// these hold the production configuration to the same promises plus what only it adds
// (Secure `__Host-` cookies, HSTS), and the headers every answer carries.
const PORTAL = 'https://portal.saltmarsh.example';
const PASSWORD = 'a long production passphrase for tests';

/** Every answer of the app arrives as if through a TLS proxy on this machine. */
const secure = (r: request.Test) => r.set('X-Forwarded-Proto', 'https');

describe('security headers and sessions in production', () => {
  let app: TroplineApp;
  let browserKey: string;
  beforeAll(async () => {
    const config = loadConfig({
      NODE_ENV: 'production',
      SQLITE_FILE: freshDatabaseFile('prod'),
      SESSION_SECRET: 'x'.repeat(48),
      SMTP_URL: 'smtp://127.0.0.1:2525',
      PUBLIC_URL: 'https://tropline.saltmarsh.example',
      TROPLINE_SERVE_APPS: '1',
      LOG_LEVEL: 'silent',
    });
    app = createApp(config);
    const { db } = app.locals.tropline;
    await app.locals.tropline.ready;
    const tenant = await new TenantsService(db).create('saltmarsh', 'Saltmarsh Authority');
    await new UsersService(db, new PasswordHasher(hashCostFor('production'))).create(
      {
        email: 'ines.marram@saltmarsh.example',
        name: 'Ines Marram',
        password: PASSWORD,
        tenantId: tenant.id,
        role: 'owner',
      },
      'test',
    );
    browserKey = (
      await new KeysService(db).issue(
        { tenantId: tenant.id, kind: 'browser', origins: [PORTAL] },
        'test',
      )
    ).token;
  });
  afterAll(() => app.locals.tropline.close());

  it('sends helmet’s headers and HSTS on API answers', async () => {
    const res = await secure(request(app).get('/api/v1/health')).expect(200);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('serves the console under a strict CSP: scripts from itself only, no plugins, no framing', async () => {
    const res = await secure(request(app).get('/console/'));
    const csp = Object.fromEntries(
      String(res.headers['content-security-policy'])
        .split(';')
        .map((d) => d.trim().split(/\s+/))
        .map(([name, ...values]) => [name, values]),
    );
    expect(csp['default-src']).toEqual(["'self'"]);
    expect(csp['script-src']).toEqual(["'self'"]);
    expect(csp['object-src']).toEqual(["'none'"]);
    expect(csp['frame-ancestors']).toEqual(["'self'"]);
    expect(csp['base-uri']).toEqual(["'self'"]);
  });

  it('answers CORS for the browser key’s listed origin only', async () => {
    const listed = await secure(request(app).options('/api/v1/projections'))
      .set('Origin', PORTAL)
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization,content-type');
    expect(listed.status).toBe(204);
    expect(listed.headers['access-control-allow-origin']).toBe(PORTAL);
    const other = await secure(request(app).options('/api/v1/projections'))
      .set('Origin', 'https://lookalike-saltmarsh.example')
      .set('Access-Control-Request-Method', 'POST');
    expect(other.status).toBe(403);
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
    const keyed = await secure(request(app).get('/api/v1/usage'))
      .set('Authorization', `Bearer ${browserKey}`)
      .set('Origin', 'https://lookalike-saltmarsh.example');
    expect(keyed.status).toBe(403);
    expect(keyed.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('signs in with a Secure, HttpOnly, SameSite __Host- cookie and refuses a change without CSRF', async () => {
    const res = await secure(request(app).post('/api/v1/session'))
      .send({ email: 'ines.marram@saltmarsh.example', password: PASSWORD })
      .expect(200);
    const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    const sid = cookies.find((c) => c.startsWith('__Host-'));
    expect(sid).toBeDefined();
    for (const flag of [/;\s*Secure/i, /;\s*HttpOnly/i, /;\s*SameSite=(Lax|Strict)/i, /Path=\//]) {
      expect(sid).toMatch(flag);
    }
    expect(sid).not.toMatch(/Domain=/i);
    // A cookie jar keeps Secure cookies off plain HTTP, so the test carries them by hand.
    const jar = cookies.map((c) => c.split(';')[0]).join('; ');
    const forged = await secure(request(app).post('/api/v1/session/sign-out-everywhere'))
      .set('Cookie', jar)
      .expect(403);
    expect(forged.headers['content-type']).toMatch(/^application\/problem\+json/);
    await secure(request(app).get('/api/v1/members')).set('Cookie', jar).expect(200);
  });

  it('throttles repeated failed sign-ins, and refuses even the right password while locked', async () => {
    const attempt = (email: string) =>
      secure(request(app).post('/api/v1/session')).send({ email, password: 'wrong guess' });
    const statuses = [];
    for (let i = 0; i < 7; i++)
      statuses.push((await attempt('ines.marram@saltmarsh.example')).status);
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses.at(-1)).toBe(429);
    const locked = await attempt('ines.marram@saltmarsh.example');
    expect(Number(locked.headers['retry-after'])).toBeGreaterThan(0);
    // The right password is refused too while locked: a guesser learns nothing from a hit.
    const right = await secure(request(app).post('/api/v1/session')).send({
      email: 'ines.marram@saltmarsh.example',
      password: PASSWORD,
    });
    expect(right.status).toBe(429);
  });
});
