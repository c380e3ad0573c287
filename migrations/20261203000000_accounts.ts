import type { Knex } from 'knex';

// Accounts (issue 6): people, their memberships, console sessions, sign-in throttling,
// invitations, password resets, the mail outbox and what the notice watcher has seen. Times are
// ISO-8601 UTC strings like the other tables, so they compare as text on SQLite and PostgreSQL.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.string('id', 36).primary();
    t.string('email', 254).notNullable().unique(); // stored lowercased
    t.string('name', 120).notNullable();
    t.string('password_hash', 200).notNullable(); // argon2id PHC string, never the password
    t.boolean('is_operator').notNullable().defaultTo(false);
    // Bumped by "sign out everywhere" and by a password reset; a session holding an older
    // value is no longer signed in. Portable, unlike searching sessions' JSON for a user id.
    t.integer('session_generation').notNullable().defaultTo(0);
    t.string('created_at', 32).notNullable();
    t.string('password_changed_at', 32).notNullable();
  });
  await knex.schema.createTable('memberships', (t) => {
    t.string('user_id', 36).notNullable().references('users.id').onDelete('CASCADE');
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('role', 16).notNullable(); // owner | admin | analyst | viewer
    t.string('created_at', 32).notNullable();
    t.primary(['user_id', 'tenant_id']);
    t.index(['tenant_id']);
  });
  // express-session's store (connect-session-knex with createTable off: the schema is ours).
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 255).primary();
    t.json('sess').notNullable();
    t.timestamp('expired').notNullable().index();
  });
  // One row per failed sign-in, counted per account and per address over a sliding window.
  await knex.schema.createTable('sign_in_failures', (t) => {
    t.increments('id').primary();
    t.string('email', 254).notNullable();
    t.string('address', 64).notNullable();
    t.string('at', 32).notNullable();
    t.index(['email', 'at']);
    t.index(['address', 'at']);
  });
  await knex.schema.createTable('invitations', (t) => {
    t.string('id', 36).primary();
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('email', 254).notNullable();
    t.string('role', 16).notNullable();
    t.string('token_hash', 64).notNullable().unique(); // SHA-256 of the link's token
    t.string('invited_by', 36);
    t.string('created_at', 32).notNullable();
    t.string('expires_at', 32).notNullable();
    t.string('accepted_at', 32);
    t.string('revoked_at', 32);
    t.index(['tenant_id']);
  });
  await knex.schema.createTable('password_resets', (t) => {
    t.string('id', 36).primary();
    t.string('user_id', 36).notNullable().references('users.id').onDelete('CASCADE');
    t.string('token_hash', 64).notNullable().unique();
    t.string('created_at', 32).notNullable();
    t.string('expires_at', 32).notNullable();
    t.string('used_at', 32);
    t.index(['user_id', 'created_at']);
  });
  // Mail is written here in the same transaction as what caused it and sent after the commit;
  // a failed delivery waits in the table for its next attempt.
  await knex.schema.createTable('mail_outbox', (t) => {
    t.increments('id').primary();
    t.string('template', 40).notNullable();
    t.string('to_address', 254).notNullable();
    t.string('subject', 200).notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    t.string('created_at', 32).notNullable();
    t.integer('attempts').notNullable().defaultTo(0);
    t.string('next_attempt_at', 32).notNullable();
    t.string('locked_until', 32);
    t.string('sent_at', 32);
    t.string('last_error', 500);
    t.index(['sent_at', 'next_attempt_at']);
  });
  // How far the notice watcher has read the audit trail (key notices).
  await knex.schema.createTable('mail_cursors', (t) => {
    t.string('name', 40).primary();
    t.integer('last_id').notNullable();
  });
  // One row per quota alert sent: the primary key makes each threshold fire once a month.
  await knex.schema.createTable('quota_alerts', (t) => {
    t.string('tenant_id', 36).notNullable().references('tenants.id').onDelete('CASCADE');
    t.string('period', 7).notNullable();
    t.integer('threshold').notNullable(); // percent: 80 or 100
    t.string('at', 32).notNullable();
    t.primary(['tenant_id', 'period', 'threshold']);
  });
  await knex.schema.alterTable('audit_events', (t) => {
    t.string('address', 64); // the client's IP address, when a request caused the event
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('audit_events', (t) => t.dropColumn('address'));
  for (const table of [
    'quota_alerts',
    'mail_cursors',
    'mail_outbox',
    'password_resets',
    'invitations',
    'sign_in_failures',
    'sessions',
    'memberships',
    'users',
  ]) {
    await knex.schema.dropTable(table);
  }
}
