import type { Knex } from 'knex';
import type { KeyPrincipal } from '../auth/key-principal';
import { memberMeter } from './console-usage-repository';
import { DEFAULT_PLAN, QuotasRepository } from './quotas-repository';

/**
 * The principal a signed-in member's compute is admitted under: their own meter in the usage
 * ledger (`memberMeter`) on the tenant's plan, so work started from the console draws on the
 * same monthly units and per-minute rate as keyed work and shows by member on the usage page.
 */
export async function memberPrincipal(
  db: Knex,
  tenantId: string,
  userId: string,
): Promise<KeyPrincipal> {
  const plan = (await new QuotasRepository(db).getPlan(tenantId)) ?? DEFAULT_PLAN;
  return {
    keyId: memberMeter(userId),
    kind: 'server',
    tenantId,
    tenantSlug: '',
    scopes: [],
    publishedOnly: false,
    monthlyUnits: plan.monthlyUnits,
    perMinute: plan.perMinute,
  };
}
