import type { Knex } from 'knex';

// Keys, quota plans, the usage ledger, rate windows, jobs and audit events (issue 5). Times are
// ISO-8601 UTC strings (fixed width, so they compare as text on SQLite and PostgreSQL alike).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('api_keys', (t) => {
    t.string('id', 16).primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('kind', 8).notNullable(); // server | browser
    t.string('name', 120).notNullable();
    // Only a SHA-256 of the secret is stored; the plaintext is shown once, at issue.
    t.string('secret_hash', 64).notNullable();
    t.text('scopes').notNullable(); // JSON array of scope names
    t.text('origins').notNullable(); // JSON array; the lookup table below serves CORS preflights
    t.integer('per_minute'); // overrides the plan's rate for this key when set
    t.string('created_at', 32).notNullable();
    t.string('expires_at', 32);
    t.string('revoked_at', 32);
    t.string('rotated_to', 16);
    t.index(['tenant_id']);
  });
  await knex.schema.createTable('api_key_origins', (t) => {
    t.string('key_id', 16).notNullable().references('api_keys.id').onDelete('CASCADE');
    t.string('origin', 300).notNullable();
    t.primary(['key_id', 'origin']);
    t.index(['origin']);
  });
  await knex.schema.createTable('quota_plans', (t) => {
    t.string('tenant_id', 36).primary().references('tenants.id').onDelete('CASCADE');
    t.integer('monthly_units').notNullable();
    t.integer('per_minute').notNullable();
    t.integer('browser_per_minute').notNullable();
    t.string('updated_at', 32).notNullable();
  });
  // One row per tenant and calendar month; admission is a single guarded UPDATE on it.
  await knex.schema.createTable('usage_counters', (t) => {
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('period', 7).notNullable(); // YYYY-MM (UTC)
    t.integer('used').notNullable().defaultTo(0);
    t.primary(['tenant_id', 'period']);
  });
  // Every admitted request, written in the same transaction as the counter it adds to.
  await knex.schema.createTable('usage_ledger', (t) => {
    t.increments('id').primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('key_id', 16).notNullable();
    t.string('period', 7).notNullable();
    t.string('endpoint', 40).notNullable();
    t.integer('units').notNullable();
    t.boolean('cached').notNullable().defaultTo(false);
    t.string('at', 32).notNullable();
    t.index(['tenant_id', 'period']);
  });
  await knex.schema.createTable('rate_windows', (t) => {
    t.string('key_id', 16).notNullable();
    t.bigInteger('window_start').notNullable(); // epoch seconds of the minute
    t.integer('count').notNullable();
    t.primary(['key_id', 'window_start']);
  });
  await knex.schema.createTable('jobs', (t) => {
    t.string('id', 36).primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('key_id', 16).notNullable();
    t.string('kind', 24).notNullable();
    t.string('status', 12).notNullable(); // queued | running | succeeded | failed | cancelled
    t.float('progress').notNullable().defaultTo(0);
    t.string('request_hash', 64).notNullable();
    t.string('idempotency_key', 200);
    t.text('request').notNullable();
    t.text('result');
    t.text('error');
    t.integer('units').notNullable();
    t.boolean('cancel_requested').notNullable().defaultTo(false);
    t.string('created_at', 32).notNullable();
    t.string('started_at', 32);
    t.string('finished_at', 32);
    t.string('heartbeat_at', 32);
    t.string('expires_at', 32).notNullable();
    t.unique(['tenant_id', 'idempotency_key']);
    t.index(['tenant_id', 'kind', 'request_hash']);
    t.index(['expires_at']);
  });
  await knex.schema.createTable('audit_events', (t) => {
    t.increments('id').primary();
    t.string('tenant_id', 36);
    t.string('actor', 80).notNullable(); // cli | key:<id> | user:<id>
    t.string('action', 60).notNullable();
    t.string('target', 120);
    t.text('detail');
    t.string('at', 32).notNullable();
    t.index(['tenant_id', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    'audit_events',
    'jobs',
    'rate_windows',
    'usage_ledger',
    'usage_counters',
    'quota_plans',
    'api_key_origins',
    'api_keys',
  ]) {
    await knex.schema.dropTable(table);
  }
}
