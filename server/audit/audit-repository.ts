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
  /** The client's IP address when a request caused the event. */
  readonly address?: string;
}

/** A stored event as the audit-trail page reads it. */
export interface StoredAuditEvent extends AuditEvent {
  readonly id: number;
}

/** What the audit-trail page filters by; every field narrows the result. */
export interface AuditQuery {
  /** The tenant whose trail is read, or null for the whole platform (operator). */
  readonly tenantId: string | null;
  /**
   * `user:<id>` of the tenant's members: their tenant-less events (sign-ins) belong to the
   * tenant's trail too.
   */
  readonly memberActors?: readonly string[];
  readonly actions?: readonly string[];
  readonly actor?: string;
  readonly target?: string;
  /** ISO instants, inclusive lower and exclusive upper bound. */
  readonly from?: string;
  readonly to?: string;
  /** Paging cursor: only events with a smaller id. */
  readonly before?: number;
  readonly limit: number;
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
      address: event.address ?? null,
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
      address: r.address ?? undefined,
      at: r.at,
    }));
  }

  /** Events matching `query`, newest first (the accounts feature's paged trail). */
  async search(query: AuditQuery): Promise<StoredAuditEvent[]> {
    const q = this.db('audit_events');
    if (query.tenantId !== null) {
      const tenantId = query.tenantId;
      const members = query.memberActors ?? [];
      q.where((w) => {
        w.where('tenant_id', tenantId);
        if (members.length) {
          w.orWhere((n) =>
            n
              .whereNull('tenant_id')
              .where((m) => m.whereIn('actor', members).orWhereIn('target', members)),
          );
        }
      });
    }
    if (query.actions?.length) q.whereIn('action', query.actions);
    if (query.actor) q.where('actor', query.actor);
    if (query.target) q.where('target', query.target);
    if (query.from) q.where('at', '>=', query.from);
    if (query.to) q.where('at', '<', query.to);
    if (query.before !== undefined) q.where('id', '<', query.before);
    const rows = await q.orderBy('id', 'desc').limit(query.limit);
    return rows.map((r) => ({
      id: Number(r.id),
      tenantId: r.tenant_id,
      actor: r.actor,
      action: r.action,
      target: r.target ?? undefined,
      detail: r.detail ? (JSON.parse(r.detail) as Record<string, unknown>) : undefined,
      at: r.at,
      address: r.address ?? undefined,
    }));
  }
}
