import type { Knex } from 'knex';

// Tenants are the unit of ownership: every key, scenario and ledger row belongs to one.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('tenants', (t) => {
    t.string('id', 36).primary();
    t.string('slug', 64).notNullable().unique();
    t.string('name', 200).notNullable();
    t.string('created_at', 32).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('tenants');
}
