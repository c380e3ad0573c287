import type { Knex } from 'knex';
import { DEMO_TENANT } from './01-demo-tenant';

/** Plans the demo operator offers; invented names, numbers of a plausible small catalogue. */
export const DEMO_OFFERS = [
  {
    id: 'field-station',
    name: 'Field station',
    description: 'A single team trying scenarios out; a portal with light traffic.',
    monthlyUnits: 25_000,
    perMinute: 300,
    browserPerMinute: 30,
  },
  {
    id: 'survey',
    name: 'Survey',
    description: 'Regular analyses and one public portal with steady traffic.',
    monthlyUnits: 100_000,
    perMinute: 600,
    browserPerMinute: 60,
  },
  {
    id: 'authority',
    name: 'Authority',
    description: 'Several teams, calibrations every week and busy public pages.',
    monthlyUnits: 250_000,
    perMinute: 1200,
    browserPerMinute: 120,
  },
  {
    id: 'catchment',
    name: 'Catchment',
    description: 'Large sweeps and ensembles across many water bodies, and high portal traffic.',
    monthlyUnits: 1_000_000,
    perMinute: 3000,
    browserPerMinute: 300,
  },
] as const;

/** The demo tenant's plan: generous enough for the portal and a tour of the API docs. */
export const DEMO_PLAN = DEMO_OFFERS[2];

export async function seed(knex: Knex): Promise<void> {
  const at = new Date().toISOString();
  await knex('plan_offers').insert(
    DEMO_OFFERS.map((o) => ({
      id: o.id,
      name: o.name,
      description: o.description,
      monthly_units: o.monthlyUnits,
      per_minute: o.perMinute,
      browser_per_minute: o.browserPerMinute,
      available: true,
      created_at: at,
      updated_at: at,
    })),
  );
  await knex('quota_plans').insert({
    tenant_id: DEMO_TENANT.id,
    monthly_units: DEMO_PLAN.monthlyUnits,
    per_minute: DEMO_PLAN.perMinute,
    browser_per_minute: DEMO_PLAN.browserPerMinute,
    offer_id: DEMO_PLAN.id,
    updated_at: at,
  });
}
