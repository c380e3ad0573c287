import type { Knex } from 'knex';
import type { KeyGuard } from '../auth/require-key';
import { setPrincipal } from '../auth/key-principal';
import { memberPrincipal } from '../quotas/member-principal';
import { requireTenantAction } from './access-guard';
import { accessOf, userOf } from './signed-in-user';

const runAnalyses = requireTenantAction('analyses:run');

/**
 * The compute routes' guard for the console (`/console/compute/…`): instead of a key with the
 * `compute` scope, a signed-in member whose role may `analyses:run` by the role matrix, in the
 * tenant of the `Tropline-Tenant` header. The session, origin and CSRF checks ran before (every
 * `/console` path passes the accounts' session stack). The work is priced on the member's meter.
 */
export function memberComputeGuard(db: Knex): KeyGuard {
  return () => async (req, res, next) => {
    runAnalyses(req, res, () => undefined);
    setPrincipal(req, await memberPrincipal(db, accessOf(req).tenantId, userOf(req).id));
    next();
  };
}
