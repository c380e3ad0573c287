import type { Knex } from 'knex';

// Owners choose their tenant's plan among the ones the operator offers (issue 6): the catalogue,
// which offer a tenant's quota numbers came from, and the tenant's own contact address for
// quota alerts. Times are ISO-8601 UTC strings like the other tables.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('plan_offers', (t) => {
    t.string('id', 40).primary(); // a slug chosen by the operator, e.g. `survey`
    t.string('name', 80).notNullable();
    t.string('description', 300).notNullable().defaultTo('');
    // The numbers never change once offered: tenants chose the offer on these terms. A new
    // offer replaces an old one, which is withdrawn (tenants on it keep it).
    t.integer('monthly_units').notNullable();
    t.integer('per_minute').notNullable();
    t.integer('browser_per_minute').notNullable();
    t.boolean('available').notNullable().defaultTo(true);
    t.string('created_at', 32).notNullable();
    t.string('updated_at', 32).notNullable();
  });
  await knex.schema.alterTable('quota_plans', (t) => {
    // The offer the numbers were copied from; null (or numbers that no longer match, after the
    // operator set them directly) means a plan set by the operator.
    t.string('offer_id', 40);
  });
  await knex.schema.alterTable('tenants', (t) => {
    t.string('contact_email', 254); // also told about quota thresholds, besides owners and admins
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('tenants', (t) => t.dropColumn('contact_email'));
  await knex.schema.alterTable('quota_plans', (t) => t.dropColumn('offer_id'));
  await knex.schema.dropTable('plan_offers');
}
