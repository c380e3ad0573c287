import type { Knex } from 'knex';
import { can, type TenantRole } from '@tropline/core';
import { hashCostFor, PasswordHasher } from '../../server/accounts/password-hasher';
import { UsersService } from '../../server/accounts/users-service';
import { KeysService } from '../../server/keys/keys-service';
import { SERVER_SCOPES } from '../../server/keys/key-scopes';
import { QuotasService } from '../../server/quotas/quotas-service';
import { TenantsService } from '../../server/tenants/tenants-service';
import { DEMO_TENANT } from '../../seeds/01-demo-tenant';
import { DEMO_USERS } from '../../seeds/03-demo-users';
import { contract } from '../api/openapi-contract';
import { SCENARIO_CONTENT } from './crash-load';
import { heavySweep } from './job-flood';
import { send, signIn, type Send } from './live-server';
import { accessOf, type Access } from './route-access';
import { PORTAL_ORIGIN } from './route-fuzz';

/** One way of calling: a key in some state, a member's session, or nothing. */
export interface Credential {
  readonly name: string;
  readonly tenant: 'A' | 'B' | '-';
  readonly key?: 'live' | 'bad' | 'wrong-origin';
  readonly browser?: boolean;
  readonly role?: TenantRole;
  readonly operator?: boolean;
  readonly send: Partial<Send>;
}

type Outcome = 'allowed' | 401 | 403 | 404;

/** The answer the guards must give, from the access table and the role matrix alone. */
export function expected(
  a: Access,
  c: Credential,
  method: string,
  objectOfA: boolean,
): Outcome | undefined {
  if (a.via === 'public' || a.via === 'self') return undefined;
  const keyRoute = a.via === 'key' || a.via === 'either';
  if (!c.key && !c.role && !c.operator) return 401;
  if (c.key) {
    // Console routes never read a key; a change from a foreign page is refused before sign-in.
    if (!keyRoute) return c.key === 'wrong-origin' && method !== 'get' ? 403 : 401;
    if (c.key === 'bad') return 401;
    if (c.key === 'wrong-origin') return 403;
    if (c.browser && !a.browser) return 403;
    return c.tenant === 'B' && objectOfA ? 404 : 'allowed';
  }
  if (a.via === 'key') return 401;
  if (a.via === 'platform') return c.operator ? 'allowed' : 403;
  if (c.operator || !can(c.role, a.action)) return 403;
  if (a.via === 'either' && a.keyOnly) return 403; // computing needs a key's quota
  return c.tenant === 'B' && objectOfA ? 404 : 'allowed';
}

/** Tenant A's objects (real ids) and markers that must never reach anyone else. */
interface Fixture {
  readonly ids: Record<string, string>;
  readonly markers: string[];
}

const MADE_UP: Record<string, string> = {
  id: '00000000-0000-4000-8000-00000000dead',
  keyId: 'abcdefghijkm',
  version: '1',
  publicId: 'no-such-public-id',
  userId: '00000000-0000-4000-8000-00000000beef',
  slug: 'larchmere',
};

/** The real id for a path parameter of a template, when tenant A has such an object. */
function realId(f: Fixture, template: string, param: string): string | undefined {
  const head = template.split('/')[1];
  if (param === 'slug') return 'larchmere';
  if (param === 'publicId') return f.ids.publicId;
  if (param === 'version') return template.includes('/datasets/') ? undefined : '1';
  if (param === 'userId') return f.ids.userId;
  if (head === 'scenarios') return f.ids.scenario;
  if (head === 'jobs' || template.startsWith('/console/compute/jobs/')) return f.ids.job;
  if (head === 'keys' || head === 'console') return f.ids.key;
  return undefined;
}

/** Builds tenant A (published scenario, finished job, keys in every state) and tenant B. */
export async function buildFixture(base: string, db: Knex, demo: { browserKey: string }) {
  const now = Date.now();
  const past = () => now - 2 * 3600_000;
  const keys = new KeysService(db);
  const all = { kind: 'server' as const, scopes: [...SERVER_SCOPES] };
  const serverA = await keys.issue({ tenantId: DEMO_TENANT.id, ...all }, 'test');
  const revoked = await keys.issue({ tenantId: DEMO_TENANT.id, ...all }, 'test');
  await keys.revoke((await keys.resolve(revoked.token))!, 'test');
  const backdated = new KeysService(db, past);
  const expiresAt = new Date(now - 3600_000).toISOString();
  const expired = await backdated.issue({ tenantId: DEMO_TENANT.id, ...all, expiresAt }, 'test');
  const rotated = await backdated.issue({ tenantId: DEMO_TENANT.id, ...all }, 'test');
  await backdated.rotate((await backdated.resolve(rotated.token))!, 60, 'test');
  await new QuotasService(db).setPlan(DEMO_TENANT.id, { browserPerMinute: 100_000 }, 'test');
  const b = await new TenantsService(db).create('fenmoor', 'Fenmoor Drainage Board');
  const serverB = await keys.issue({ tenantId: b.id, ...all }, 'test');
  const ownerB = { email: 'ada.brackwater@fenmoor.example', password: 'fenmoor-owner-test-pw' };
  await new UsersService(db, new PasswordHasher(hashCostFor('test'))).create(
    { ...ownerB, name: 'Ada Brackwater', tenantId: b.id, role: 'owner' },
    'test',
  );

  const created = await send(base, 'POST', '/scenarios', {
    key: serverA.token,
    body: { ...SCENARIO_CONTENT, changeNote: 'Matrix fixture' },
  });
  const scenario = (created.json!.scenario as { id: string }).id;
  const pub = await send(base, 'POST', `/scenarios/${scenario}/versions/1/publish`, {
    key: serverA.token,
  });
  const job = await send(base, 'POST', '/sweeps', {
    key: serverA.token,
    body: { ...heavySweep(1, 2), transient: 10, window: 10 },
  });
  const jobId = String(job.json!.id);
  for (let i = 0; i < 600; i++) {
    const j = await send(base, 'GET', `/jobs/${jobId}`, { key: serverA.token });
    if (j.json?.status === 'succeeded' || j.json?.status === 'failed') break;
    await new Promise((r) => setTimeout(r, 100));
  }
  const owner = DEMO_USERS.find((u) => u.role === 'owner')!;
  const userId = String(
    (await db('users').where({ email: owner.email }).first<{ id: string }>()).id,
  );
  const fixture: Fixture = {
    ids: {
      scenario,
      publicId: String(pub.json!.publicId),
      job: jobId,
      key: serverA.key.id,
      userId,
    },
    markers: [scenario, jobId, serverA.key.id, SCENARIO_CONTENT.name, owner.email],
  };

  const creds: Credential[] = [
    { name: 'no credential', tenant: '-', send: {} },
    { name: 'server key', tenant: 'A', key: 'live', send: { key: serverA.token } },
    {
      name: 'browser key',
      tenant: 'A',
      key: 'live',
      browser: true,
      send: {
        key: demo.browserKey,
        origin: PORTAL_ORIGIN,
      },
    },
    {
      name: 'browser key, wrong origin',
      tenant: 'A',
      key: 'wrong-origin',
      browser: true,
      send: {
        key: demo.browserKey,
        origin: 'https://elsewhere.example',
      },
    },
    { name: 'revoked key', tenant: 'A', key: 'bad', send: { key: revoked.token } },
    { name: 'expired key', tenant: 'A', key: 'bad', send: { key: expired.token } },
    { name: 'rotated-out key', tenant: 'A', key: 'bad', send: { key: rotated.token } },
    { name: 'server key of B', tenant: 'B', key: 'live', send: { key: serverB.token } },
  ];
  for (const u of DEMO_USERS) {
    const s = await signIn(base, u.email, u.password);
    // The operator names the tenant too, so a refusal is about the role, not a missing header.
    const headers = { 'x-csrf-token': s.csrf, 'tropline-tenant': 'larchmere' };
    creds.push(
      u.role === 'operator'
        ? { name: 'operator', tenant: '-', operator: true, send: { cookie: s.cookie, headers } }
        : { name: u.role, tenant: 'A', role: u.role, send: { cookie: s.cookie, headers } },
    );
  }
  const sb = await signIn(base, ownerB.email, ownerB.password);
  creds.push({
    name: 'owner of B',
    tenant: 'B',
    role: 'owner',
    send: {
      cookie: sb.cookie,
      headers: { 'x-csrf-token': sb.csrf },
    },
  });
  return { fixture, creds };
}

/** One cell of the matrix that did not answer as the table and the role matrix say. */
export interface Mismatch {
  readonly cell: string;
  readonly want: Outcome;
  readonly got: number;
  readonly leak?: string;
}

/**
 * Sends every operation of the spec with every credential and compares each answer with
 * `expected`. Tenant B aims at tenant A's real ids; tenant A's own callers aim mutations at
 * made-up ids, so the run changes nothing it later reads. Returns the mismatches and the count.
 */
export async function runMatrix(
  base: string,
  fixture: Fixture,
  creds: readonly Credential[],
): Promise<{ cells: number; mismatches: Mismatch[] }> {
  const cells: (() => Promise<Mismatch | undefined>)[] = [];
  for (const { method, template } of contract.operations()) {
    const access = accessOf(method, template);
    if (!access) throw new Error(`no access entry for ${method} ${template}`);
    const params = [...template.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]!);
    const objectOfA = params.some((p) => p !== 'slug');
    for (const c of creds) {
      const want = expected(access, c, method, objectOfA);
      if (want === undefined) continue;
      const real = c.tenant === 'B' || (method === 'get' && !template.endsWith('/events'));
      const sent: string[] = [];
      // A read of A's own real objects must succeed outright, not merely pass the guard.
      const whole = c.tenant === 'A' && real && params.every((p) => realId(fixture, template, p));
      let path = template;
      for (const p of params) {
        const id =
          (real ? realId(fixture, template, p) : undefined) ??
          (p === 'id' && template.startsWith('/keys') ? MADE_UP.keyId : MADE_UP[p]!);
        sent.push(id);
        path = path.replace(`{${p}}`, id);
      }
      if (template.endsWith('/comparison')) path += '?from=1&to=1';
      const body = method === 'get' || method === 'delete' ? undefined : {};
      cells.push(async () => {
        const a = await send(base, method.toUpperCase(), path, { ...c.send, body });
        const cell = `${method.toUpperCase()} ${template} as ${c.name}`;
        if (c.tenant !== 'A') {
          let text = a.text;
          for (const id of sent) text = text.replaceAll(id, '');
          const leak = fixture.markers.find((m) => text.includes(m));
          if (leak) return { cell, want, got: a.status, leak };
        }
        // A body refused as invalid (400/422) says nothing about whether A's object exists.
        const bodyFirst = want === 404 && body !== undefined && [400, 415, 422].includes(a.status);
        const ok =
          want === 'allowed'
            ? whole
              ? a.status < 300
              : a.status < 500 && a.status !== 401 && a.status !== 403
            : a.status === want || bodyFirst;
        return ok ? undefined : { cell, want, got: a.status };
      });
    }
  }
  const mismatches: Mismatch[] = [];
  for (let i = 0; i < cells.length; i += 6) {
    const batch = await Promise.all(cells.slice(i, i + 6).map((run) => run()));
    mismatches.push(...batch.filter((m): m is Mismatch => m !== undefined));
  }
  return { cells: cells.length, mismatches };
}
