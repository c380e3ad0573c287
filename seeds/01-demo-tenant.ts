import type { Knex } from 'knex';

/** The invented agency the demo portal belongs to. */
export const DEMO_TENANT = {
  id: '00000000-0000-4000-8000-000000000001',
  slug: 'larchmere',
  name: 'Larchmere Lakes & Uplands Authority (demo)',
};

export async function seed(knex: Knex): Promise<void> {
  await knex('tenants').insert({ ...DEMO_TENANT, created_at: new Date().toISOString() });
}
