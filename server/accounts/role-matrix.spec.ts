import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ACTIONS,
  can,
  canAssignRole,
  ROLE_MATRIX,
  TENANT_ROLES,
  type Action,
} from '@tropline/core';
import {
  clockedApp,
  signInDemo,
  type ClockedApp,
  type SignedInAgent,
} from './testing/signed-in-agent';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

interface RouteCase {
  readonly method: Method;
  readonly path: string;
  readonly action: Action;
  /** Status when the role is allowed (404 for made-up ids: the guard let the request in). */
  readonly allowed: number;
  readonly body?: () => object;
}

const nobody = '00000000-0000-4000-8000-00000000dead';
let serial = 0;

/** Every console route that exists today, with the action the matrix ties it to. */
const ROUTES: readonly RouteCase[] = [
  { method: 'get', path: '/members', action: 'members:read', allowed: 200 },
  {
    method: 'patch',
    path: `/members/${nobody}`,
    action: 'members:manage',
    allowed: 404,
    body: () => ({ role: 'viewer' }),
  },
  { method: 'delete', path: `/members/${nobody}`, action: 'members:manage', allowed: 404 },
  { method: 'get', path: '/invitations', action: 'members:manage', allowed: 200 },
  {
    method: 'post',
    path: '/invitations',
    action: 'members:manage',
    allowed: 201,
    body: () => ({ email: `matrix.${++serial}@larchmere.example`, role: 'viewer' }),
  },
  { method: 'delete', path: `/invitations/${nobody}`, action: 'members:manage', allowed: 404 },
  { method: 'get', path: '/audit-events', action: 'audit:read', allowed: 200 },
  { method: 'get', path: '/console/keys', action: 'keys:read', allowed: 200 },
  {
    method: 'post',
    path: '/console/keys',
    action: 'keys:manage',
    allowed: 201,
    body: () => ({ kind: 'server' }),
  },
  {
    method: 'post',
    path: '/console/keys/abcdefghijkm/rotate',
    action: 'keys:manage',
    allowed: 404,
    body: () => ({}),
  },
  { method: 'delete', path: '/console/keys/abcdefghijkm', action: 'keys:manage', allowed: 404 },
  {
    method: 'post',
    path: '/tenants',
    action: 'tenants:create',
    allowed: 201,
    body: () => ({ slug: `matrix-${++serial}`, name: 'Matrix Test Basin' }),
  },
  {
    method: 'put',
    path: '/tenants/larchmere/plan',
    action: 'quotas:set',
    allowed: 200,
    body: () => ({ monthlyUnits: 250_000 }),
  },
  { method: 'get', path: '/tenant', action: 'tenant:manage', allowed: 200 },
  {
    method: 'patch',
    path: '/tenant',
    action: 'tenant:manage',
    allowed: 200,
    body: () => ({ contactEmail: null }),
  },
  { method: 'get', path: '/tenant/plan', action: 'plan:manage', allowed: 200 },
  {
    method: 'put',
    path: '/tenant/plan',
    action: 'plan:manage',
    allowed: 200,
    body: () => ({ offer: 'authority' }),
  },
  { method: 'get', path: '/plan-offers', action: 'plans:offer', allowed: 200 },
  {
    method: 'post',
    path: '/plan-offers',
    action: 'plans:offer',
    allowed: 201,
    body: () => ({
      id: `matrix-${++serial}`,
      name: 'Matrix plan',
      monthlyUnits: 1000,
      perMinute: 10,
      browserPerMinute: 1,
    }),
  },
  {
    method: 'patch',
    path: '/plan-offers/no-such-plan',
    action: 'plans:offer',
    allowed: 404,
    body: () => ({ available: false }),
  },
];

const ROLES = [...TENANT_ROLES, 'operator'] as const;

describe('the role matrix on every console route', () => {
  let t: ClockedApp;
  const agents = new Map<string, SignedInAgent>();
  beforeAll(async () => {
    t = await clockedApp();
    for (const role of ROLES) agents.set(role, await signInDemo(t.app, role));
  });
  afterAll(() => t.close());

  for (const route of ROUTES) {
    for (const role of ROLES) {
      const allowed = can(role, route.action);
      const name = `${route.method.toUpperCase()} ${route.path} as ${role}`;
      it(`${name}: ${allowed ? 'allowed' : 'refused'}`, async () => {
        const { agent, csrf } = agents.get(role)!;
        let req = agent[route.method](`/api/v1${route.path}`)
          .set('X-CSRF-Token', csrf)
          .set('Tropline-Tenant', 'larchmere');
        if (route.body) req = req.send(route.body());
        const res = await req;
        if (allowed) {
          expect(res.status, JSON.stringify(res.body)).toBe(route.allowed);
        } else {
          expect(res.status).toBe(403);
          expect(res.body.type).toMatch(/(role-forbidden|not-a-member)$/);
        }
      });
    }
  }
});

describe('can()', () => {
  it('gives each role everything the role below it has', () => {
    const ladder = ['viewer', 'analyst', 'admin', 'owner'] as const;
    for (let i = 1; i < ladder.length; i++) {
      for (const action of ROLE_MATRIX[ladder[i - 1]!]) expect(can(ladder[i]!, action)).toBe(true);
    }
  });

  it('keeps platform actions to the operator and tenant actions out of its hands', () => {
    fc.assert(
      fc.property(fc.constantFrom(...ACTIONS), fc.constantFrom(...TENANT_ROLES), (action, role) => {
        const platform = ['tenants:create', 'quotas:set', 'plans:offer'].includes(action);
        expect(can('operator', action)).toBe(platform);
        if (platform) expect(can(role, action)).toBe(false);
      }),
    );
  });

  it('matches the issue: viewers read, analysts edit, admins manage keys, owners the plan', () => {
    expect(can('viewer', 'scenarios:read')).toBe(true);
    expect(can('viewer', 'scenarios:write')).toBe(false);
    expect(can('analyst', 'analyses:run')).toBe(true);
    expect(can('analyst', 'keys:manage')).toBe(false);
    expect(can('admin', 'members:manage')).toBe(true);
    expect(can('admin', 'plan:manage')).toBe(false);
    expect(can('owner', 'plan:manage')).toBe(true);
    expect(can(undefined, 'scenarios:read')).toBe(false);
  });

  it('lets only owners hand out or take away ownership', () => {
    expect(canAssignRole('owner', 'owner')).toBe(true);
    expect(canAssignRole('admin', 'owner')).toBe(false);
    expect(canAssignRole('admin', 'analyst')).toBe(true);
    expect(canAssignRole('analyst', 'viewer')).toBe(false);
  });
});
