import type { Knex } from 'knex';

// Scenarios, their immutable versions and the monitoring datasets tied to them (issue 8).
// Times are ISO-8601 UTC strings; JSON documents are stored as text, the uploaded CSV as bytes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('scenarios', (t) => {
    t.string('id', 36).primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    // Assigned at first publication and never changed: portals bind to it.
    t.string('public_id', 64).unique();
    t.integer('latest_version').notNullable();
    t.integer('published_version');
    t.string('created_by', 80).notNullable();
    t.string('created_at', 32).notNullable();
    t.index(['tenant_id']);
  });
  await knex.schema.createTable('scenario_versions', (t) => {
    t.string('scenario_id', 36).notNullable().references('scenarios.id').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.string('status', 12).notNullable(); // draft | published | retired
    t.text('content').notNullable();
    t.string('change_note', 500).notNullable();
    t.string('author', 80).notNullable();
    t.string('created_at', 32).notNullable();
    t.string('published_at', 32);
    t.string('retired_at', 32);
    t.primary(['scenario_id', 'version']);
  });
  await knex.schema.createTable('dataset_versions', (t) => {
    t.string('id', 36).primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('scenario_id', 36).notNullable().references('scenarios.id').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.string('filename', 200).notNullable();
    t.binary('original').notNullable(); // the upload exactly as sent, for download
    t.text('series').notNullable(); // parsed: times, levels, standard errors
    t.integer('rows').notNullable();
    t.string('sha256', 64).notNullable();
    t.string('change_note', 500).notNullable();
    t.string('author', 80).notNullable();
    t.string('created_at', 32).notNullable();
    t.unique(['scenario_id', 'version']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('dataset_versions');
  await knex.schema.dropTable('scenario_versions');
  await knex.schema.dropTable('scenarios');
}
