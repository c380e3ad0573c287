import type { Knex } from 'knex';

/** One security-relevant event: who did what to which object, and when. */
export interface AuditEvent {
  readonly tenantId: string | null;
  /** `cli`, `key:<id>` or `user:<id>`. */
  readonly actor: string;
  /** Dotted verb, e.g. `key.issue`, `key.revoke`, `quota.set`. */
  readonly action: string;
  readonly target?: string;
  readonly detail?: Record<string, unknown>;
  readonly at: string;
}

/** Append-only storage of audit events. */
export class AuditRepository {
  constructor(private readonly db: Knex | Knex.Transaction) {}

  /** Appends one event. */
  async record(event: AuditEvent): Promise<void> {
    await this.db('audit_events').insert({
      tenant_id: event.tenantId,
      actor: event.actor,
      action: event.action,
      target: event.target ?? null,
      detail: event.detail ? JSON.stringify(event.detail) : null,
      at: event.at,
    });
  }

  /** A tenant's events, newest first. */
  async listForTenant(tenantId: string, limit = 100): Promise<AuditEvent[]> {
    const rows = await this.db('audit_events')
      .where({ tenant_id: tenantId })
      .orderBy('id', 'desc')
      .limit(limit);
    return rows.map((r) => ({
      tenantId: r.tenant_id,
      actor: r.actor,
      action: r.action,
      target: r.target ?? undefined,
      detail: r.detail ? (JSON.parse(r.detail) as Record<string, unknown>) : undefined,
      at: r.at,
    }));
  }
}
