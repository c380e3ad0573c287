import type { Knex } from 'knex';
import { DEMO_TENANT } from './01-demo-tenant';

/** The demo tenant's plan: generous enough for the portal and a tour of the API docs. */
export const DEMO_PLAN = { monthlyUnits: 250_000, perMinute: 1200, browserPerMinute: 120 };

export async function seed(knex: Knex): Promise<void> {
  await knex('quota_plans').insert({
    tenant_id: DEMO_TENANT.id,
    monthly_units: DEMO_PLAN.monthlyUnits,
    per_minute: DEMO_PLAN.perMinute,
    browser_per_minute: DEMO_PLAN.browserPerMinute,
    updated_at: new Date().toISOString(),
  });
}
