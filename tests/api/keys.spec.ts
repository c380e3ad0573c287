import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { KeysService } from '../../server/keys/keys-service';
import { parseKey } from '../../server/keys/key-token';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { benchmarkProjection, DEMO_ORIGIN, startHarness, type Harness } from './api-harness';

describe('API keys', () => {
  let h: Harness;
  let admin: string;
  let dir: string;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'tropline-keys-'));
    h = await startHarness({ sqliteFile: join(dir, 'keys.sqlite') });
    const keys = new KeysService(h.app.locals.tropline.db, h.clock.now);
    const issued = await keys.issue(
      {
        tenantId: DEMO_TENANT.id,
        kind: 'server',
        scopes: ['keys:manage', 'compute', 'usage:read'],
      },
      'test',
    );
    admin = issued.token;
  });
  afterAll(() => h.close());

  const projection = (key: string, origin?: string) =>
    h.call('post', '/projections', key, origin).send(benchmarkProjection(10, 11));

  it('shows a key once: in the issue answer, never in listings', async () => {
    const res = await h
      .call('post', '/keys', admin)
      .send({
        kind: 'browser',
        name: 'Fenwick portal',
        origins: ['https://portal.fenwick.example/'],
      })
      .expect(201);
    const token: string = res.body.token;
    expect(parseKey(token)?.kind).toBe('browser');
    expect(res.body.key.origins).toEqual(['https://portal.fenwick.example']);
    expect(res.headers['cache-control']).toBe('no-store');
    const list = await h.call('get', '/keys', admin).expect(200);
    expect(JSON.stringify(list.body)).not.toContain(parseKey(token)!.secret);
    expect(list.body.keys.map((k: { id: string }) => k.id)).toContain(res.body.key.id);
  });

  it('stores no plaintext: no secret appears anywhere in the database files', async () => {
    const tokens = [admin, h.demo.serverKey, h.demo.browserKey];
    for (let i = 0; i < 3; i++) {
      tokens.push(
        (await h.call('post', '/keys', admin).send({ kind: 'server' }).expect(201)).body.token,
      );
    }
    await h.app.locals.tropline.db.raw('PRAGMA wal_checkpoint(PASSIVE)');
    const files = readdirSync(dir).filter((f) => f.startsWith('keys.sqlite'));
    expect(files.length).toBeGreaterThan(0);
    const bytes = Buffer.concat(files.map((f) => readFileSync(join(dir, f))));
    for (const token of tokens) {
      expect(bytes.includes(Buffer.from(parseKey(token)!.secret))).toBe(false);
      expect(bytes.includes(Buffer.from(token))).toBe(false);
    }
  });

  it('refuses a revoked key on the very next request', async () => {
    const { token, key } = (
      await h.call('post', '/keys', admin).send({ kind: 'server' }).expect(201)
    ).body;
    await projection(token).expect(200);
    await h.call('delete', `/keys/${key.id}`, admin).expect(204);
    const res = await projection(token).expect(401);
    expect(res.body.detail).toMatch(/revoked/);
    expect(res.headers['www-authenticate']).toMatch(/^Bearer/);
  });

  it('honours a rotation overlap and ends it', async () => {
    const { token: old, key } = (
      await h.call('post', '/keys', admin).send({ kind: 'server' }).expect(201)
    ).body;
    const rotated = await h
      .call('post', `/keys/${key.id}/rotate`, admin)
      .send({ overlapSeconds: 3600 })
      .expect(201);
    await projection(old).expect(200);
    await projection(rotated.body.token).expect(200);
    h.clock.advance(3599_000);
    await projection(old).expect(200);
    h.clock.advance(2_000);
    const res = await projection(old).expect(401);
    expect(res.body.detail).toMatch(/rotated/);
    await projection(rotated.body.token).expect(200);
    await h.call('post', `/keys/${key.id}/rotate`, admin).send({}).expect(409);
  });

  it('honours expiry', async () => {
    const expiresAt = new Date(h.clock.now() + 60_000).toISOString();
    const { token } = (
      await h.call('post', '/keys', admin).send({ kind: 'server', expiresAt }).expect(201)
    ).body;
    await projection(token).expect(200);
    h.clock.advance(61_000);
    expect((await projection(token).expect(401)).body.detail).toMatch(/expired/);
  });

  it('recognises a damaged key by its checksum without looking it up', async () => {
    const last = h.demo.serverKey.at(-1) === 'a' ? 'b' : 'a';
    const res = await projection(h.demo.serverKey.slice(0, -1) + last).expect(401);
    expect(res.body.detail).toMatch(/checksum/);
    await h.call('post', '/projections').send(benchmarkProjection()).expect(401);
  });

  it('binds a browser key to its origins and to computing', async () => {
    await projection(h.demo.browserKey, DEMO_ORIGIN).expect(200);
    const elsewhere = await projection(h.demo.browserKey, 'https://elsewhere.example').expect(403);
    expect(elsewhere.headers['access-control-allow-origin']).toBeUndefined();
    await projection(h.demo.browserKey).expect(403); // no Origin at all
    const usage = await h.call('get', '/usage', h.demo.browserKey, DEMO_ORIGIN).expect(403);
    expect(usage.body.scope).toBe('usage:read');
    await h.call('get', '/keys', h.demo.browserKey, DEMO_ORIGIN).expect(403);
    await h
      .call('post', '/keys', h.demo.browserKey, DEMO_ORIGIN)
      .send({ kind: 'server' })
      .expect(403);
    const pre = await h
      .call('options', '/projections', undefined, 'https://elsewhere.example')
      .set('Access-Control-Request-Method', 'POST')
      .expect(403);
    expect(pre.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('takes a same-origin GET, which browsers send without Origin, as coming from this host', async () => {
    // Fetch standard: Origin is omitted on same-origin GETs; Sec-Fetch-Site says same-origin.
    // The job progress stream and job polling of the demo portal are such requests.
    const sameOrigin = () =>
      h
        .call('get', '/jobs/00000000000000000000000000000000', h.demo.browserKey)
        .set('Host', new URL(DEMO_ORIGIN).host);
    const listed = await sameOrigin().set('Sec-Fetch-Site', 'same-origin');
    expect(listed.status).toBe(404); // authenticated: the job simply does not exist
    await sameOrigin().set('Sec-Fetch-Site', 'cross-site').expect(403);
    await h
      .call('get', '/jobs/00000000000000000000000000000000', h.demo.browserKey)
      .set('Host', 'elsewhere.example')
      .set('Sec-Fetch-Site', 'same-origin')
      .expect(403);
  });

  it('refuses a server key without the route’s scope', async () => {
    const { token } = (
      await h
        .call('post', '/keys', admin)
        .send({ kind: 'server', scopes: ['usage:read'] })
        .expect(201)
    ).body;
    expect((await projection(token).expect(403)).body.scope).toBe('compute');
    await h.call('get', '/usage', token).expect(200);
  });

  it('names bad fields when issuing', async () => {
    const res = await h
      .call('post', '/keys', admin)
      .send({ kind: 'browser', origins: ['not a url'], scopes: ['usage:read'] })
      .expect(400);
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer);
    expect(pointers).toEqual(expect.arrayContaining(['/origins/0', '/scopes/0']));
  });
});
