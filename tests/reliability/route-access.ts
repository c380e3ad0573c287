import type { Action } from '@tropline/core';

/**
 * Who may call each operation of openapi.yaml, as the server's guards say it (the scopes of
 * server/auth, the actions of the role matrix). The access matrix derives every expected answer
 * from this table and `can()`; a test fails when an operation is missing from it.
 */
export type Access =
  /** No credential (health, sign-in, invitations by token, resets, dev mailbox, preflights). */
  | { readonly via: 'public' }
  /** The caller's own session (sign-out and who-am-I), covered by session-routes.spec.ts. */
  | { readonly via: 'self' }
  /** A bearer key only; `browser` when browser keys may call it too. */
  | { readonly via: 'key'; readonly scope: string; readonly browser?: boolean }
  /** A key (scope) or a member's session (action); `keyOnly` when sessions are refused. */
  | {
      readonly via: 'either';
      readonly scope: string;
      readonly action: Action;
      readonly browser?: boolean;
      readonly keyOnly?: boolean;
    }
  /** A member's session in the tenant, by the role matrix. */
  | { readonly via: 'session'; readonly action: Action }
  /** The platform operator's session. */
  | { readonly via: 'platform'; readonly action: Action };

const compute = { via: 'key', scope: 'compute', browser: true } as const;
const keys = { via: 'key', scope: 'keys:manage' } as const;
const read = { via: 'either', scope: 'scenarios:read', action: 'scenarios:read' } as const;
const write = { via: 'either', scope: 'scenarios:write', action: 'scenarios:write' } as const;
const publish = { via: 'either', scope: 'scenarios:write', action: 'scenarios:publish' } as const;
const dataRead = { via: 'either', scope: 'scenarios:read', action: 'data:read' } as const;
const dataWrite = { via: 'either', scope: 'scenarios:write', action: 'data:write' } as const;
const open = { via: 'public' } as const;
const run = { via: 'either', scope: 'scenarios:write', action: 'analyses:run' } as const;
const memberCompute = { via: 'session', action: 'analyses:run' } as const;

/** `method template` → access. */
export const ROUTE_ACCESS: Readonly<Record<string, Access>> = {
  'get /health': open,
  'post /projections': compute,
  'post /equilibria': compute,
  'post /regimes': compute,
  'post /sweeps': compute,
  'post /regime-maps': compute,
  'post /ensembles': compute,
  'post /comparisons': compute,
  'get /jobs/{id}': compute,
  'delete /jobs/{id}': compute,
  'get /jobs/{id}/events': compute,
  'get /usage': { via: 'key', scope: 'usage:read' },
  'get /keys': keys,
  'post /keys': keys,
  'delete /keys/{id}': keys,
  'post /keys/{id}/rotate': keys,
  'post /session': open,
  'get /session': { via: 'self' },
  'delete /session': { via: 'self' },
  'post /session/sign-out-everywhere': { via: 'self' },
  'get /members': { via: 'session', action: 'members:read' },
  'patch /members/{userId}': { via: 'session', action: 'members:manage' },
  'delete /members/{userId}': { via: 'session', action: 'members:manage' },
  'get /invitations': { via: 'session', action: 'members:manage' },
  'post /invitations': { via: 'session', action: 'members:manage' },
  'delete /invitations/{id}': { via: 'session', action: 'members:manage' },
  'post /invitations/lookup': open,
  'post /invitations/accept': open,
  'post /password-resets': open,
  'post /password-resets/complete': open,
  'get /audit-events': { via: 'session', action: 'audit:read' },
  'get /console/keys': { via: 'session', action: 'keys:read' },
  'post /console/keys': { via: 'session', action: 'keys:manage' },
  'delete /console/keys/{id}': { via: 'session', action: 'keys:manage' },
  'post /console/keys/{id}/rotate': { via: 'session', action: 'keys:manage' },
  'get /console/usage': { via: 'session', action: 'usage:read' },
  'post /console/compute/projections': memberCompute,
  'post /console/compute/equilibria': memberCompute,
  'post /console/compute/regimes': memberCompute,
  'post /console/compute/sweeps': memberCompute,
  'post /console/compute/regime-maps': memberCompute,
  'post /console/compute/ensembles': memberCompute,
  'post /console/compute/comparisons': memberCompute,
  'get /console/compute/jobs/{id}': memberCompute,
  'delete /console/compute/jobs/{id}': memberCompute,
  'get /console/compute/jobs/{id}/events': memberCompute,
  'post /tenants': { via: 'platform', action: 'tenants:create' },
  'put /tenants/{slug}/plan': { via: 'platform', action: 'quotas:set' },
  'get /tenant': { via: 'session', action: 'tenant:manage' },
  'patch /tenant': { via: 'session', action: 'tenant:manage' },
  'get /tenant/plan': { via: 'session', action: 'plan:manage' },
  'put /tenant/plan': { via: 'session', action: 'plan:manage' },
  'get /plan-offers': { via: 'platform', action: 'plans:offer' },
  'post /plan-offers': { via: 'platform', action: 'plans:offer' },
  'patch /plan-offers/{id}': { via: 'platform', action: 'plans:offer' },
  'get /dev/mailbox': open,
  'delete /dev/mailbox': open,
  'get /dev/mailbox/{id}': open,
  'get /scenarios': read,
  'post /scenarios': write,
  'post /scenario-imports': write,
  'get /scenarios/{id}': read,
  'post /scenarios/{id}/versions': write,
  'get /scenarios/{id}/versions/{version}': read,
  'post /scenarios/{id}/versions/{version}/publish': publish,
  'post /scenarios/{id}/versions/{version}/retire': publish,
  'get /scenarios/{id}/versions/{version}/export': read,
  'get /scenarios/{id}/comparison': read,
  'get /published-scenarios/{publicId}': { ...read, browser: true },
  'post /published-scenarios/{publicId}/projections': { ...read, browser: true, keyOnly: true },
  'post /published-scenarios/{publicId}/regimes': { ...read, browser: true, keyOnly: true },
  'post /published-scenarios/{publicId}/equilibria': { ...read, browser: true, keyOnly: true },
  'get /scenarios/{id}/datasets': dataRead,
  'post /scenarios/{id}/datasets': dataWrite,
  'get /scenarios/{id}/datasets/{version}': dataRead,
  'get /scenarios/{id}/datasets/{version}/csv': dataRead,
  'post /scenarios/{id}/calibrations': run,
  'get /calibrations/{id}': read,
  'delete /calibrations/{id}': run,
  'get /calibrations/{id}/events': run,
  'post /calibrations/{id}/versions': write,
};

/** Every CORS preflight of the spec is public (answered for listed origins only). */
export function accessOf(method: string, template: string): Access | undefined {
  if (method === 'options') return open;
  return ROUTE_ACCESS[`${method} ${template}`];
}
