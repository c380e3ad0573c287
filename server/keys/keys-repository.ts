import type { Knex } from 'knex';
import { compileQuery, PreparedRead } from '../db/compiled-query';
import type { KeyKind } from './key-token';

/** An API key row as the service sees it (never the plaintext). */
export interface KeyRecord {
  readonly id: string;
  readonly tenantId: string;
  readonly kind: KeyKind;
  readonly name: string;
  readonly secretHash: string;
  readonly scopes: string[];
  readonly origins: string[];
  readonly perMinute: number | null;
  readonly createdAt: string;
  readonly expiresAt: string | null;
  readonly revokedAt: string | null;
  readonly rotatedTo: string | null;
}

/** A key joined with its tenant and the tenant's plan: all authentication needs, in one read. */
export interface KeyWithPlan extends KeyRecord {
  readonly tenantSlug: string;
  readonly monthlyUnits: number | null;
  readonly planPerMinute: number | null;
  readonly browserPerMinute: number | null;
}

interface KeyRow {
  id: string;
  tenant_id: string;
  kind: KeyKind;
  name: string;
  secret_hash: string;
  scopes: string;
  origins: string;
  per_minute: number | null;
  created_at: string;
  expires_at: string | null;
  revoked_at: string | null;
  rotated_to: string | null;
}

interface KeyWithPlanRow extends KeyRow {
  tenant_slug: string;
  monthly_units: number | null;
  plan_per_minute: number | null;
  browser_per_minute: number | null;
}

function toRecord(row: KeyRow): KeyRecord {
  return {
    id: row.id,
    tenantId: row.tenant_id,
    kind: row.kind,
    name: row.name,
    secretHash: row.secret_hash,
    scopes: JSON.parse(row.scopes) as string[],
    origins: JSON.parse(row.origins) as string[],
    perMinute: row.per_minute,
    createdAt: row.created_at,
    expiresAt: row.expires_at,
    revokedAt: row.revoked_at,
    rotatedTo: row.rotated_to,
  };
}

/** Storage of API keys; plain objects in, plain objects out. */
export class KeysRepository {
  private readonly withPlan: PreparedRead<'id', KeyWithPlanRow>;

  constructor(private readonly db: Knex) {
    this.withPlan = new PreparedRead(
      db,
      compileQuery(db, ['id'], (q, p) =>
        q('api_keys as k')
          .join('tenants as t', 't.id', 'k.tenant_id')
          .leftJoin('quota_plans as p', 'p.tenant_id', 'k.tenant_id')
          .where('k.id', p.id)
          // By primary key, so at most one row: no `first()`, whose bound `LIMIT ?` makes
          // SQLite run this join several times slower.
          .select(
            'k.*',
            't.slug as tenant_slug',
            'p.monthly_units',
            'p.per_minute as plan_per_minute',
            'p.browser_per_minute',
          ),
      ),
    );
  }

  /** Stores a new key and its origins in one transaction. */
  async insert(key: Omit<KeyRecord, 'revokedAt' | 'rotatedTo'>, trx?: Knex.Transaction) {
    const run = async (q: Knex | Knex.Transaction) => {
      await q('api_keys').insert({
        id: key.id,
        tenant_id: key.tenantId,
        kind: key.kind,
        name: key.name,
        secret_hash: key.secretHash,
        scopes: JSON.stringify(key.scopes),
        origins: JSON.stringify(key.origins),
        per_minute: key.perMinute,
        created_at: key.createdAt,
        expires_at: key.expiresAt,
      });
      if (key.origins.length > 0) {
        await q('api_key_origins').insert(
          key.origins.map((origin) => ({ key_id: key.id, origin })),
        );
      }
    };
    if (trx) await run(trx);
    else await this.db.transaction(run);
  }

  /**
   * One key with its tenant and plan, or undefined. Every keyed request asks this (nothing is
   * cached, so a revocation holds from the very next request), so the query is compiled once
   * and runs as a prepared statement.
   */
  async findWithPlan(id: string): Promise<KeyWithPlan | undefined> {
    const row = await this.withPlan.first({ id });
    if (!row) return undefined;
    return {
      ...toRecord(row),
      tenantSlug: row.tenant_slug,
      monthlyUnits: row.monthly_units ?? null,
      planPerMinute: row.plan_per_minute ?? null,
      browserPerMinute: row.browser_per_minute ?? null,
    };
  }

  /** One key, or undefined. */
  async find(id: string): Promise<KeyRecord | undefined> {
    const row = await this.db('api_keys').where({ id }).first();
    return row ? toRecord(row as KeyRow) : undefined;
  }

  /** A tenant's keys, newest first. */
  async listForTenant(tenantId: string): Promise<KeyRecord[]> {
    const rows = await this.db('api_keys')
      .where({ tenant_id: tenantId })
      .orderBy([
        { column: 'created_at', order: 'desc' },
        { column: 'id', order: 'asc' },
      ]);
    return (rows as KeyRow[]).map(toRecord);
  }

  /** Marks a key revoked; returns whether a live key changed. */
  async revoke(id: string, at: string, trx: Knex.Transaction | Knex = this.db): Promise<boolean> {
    const n = await trx('api_keys').where({ id }).whereNull('revoked_at').update({
      revoked_at: at,
    });
    return n > 0;
  }

  /** Ends an old key's life at `until` and links it to its successor; false if it was already
   * rotated or revoked (so concurrent rotations cannot both win). */
  async markRotated(id: string, to: string, until: string, trx: Knex.Transaction) {
    const changed = await trx('api_keys')
      .where({ id })
      .whereNull('rotated_to')
      .whereNull('revoked_at')
      .update({ rotated_to: to, expires_at: until });
    return changed === 1;
  }

  /** Whether any live browser key lists this origin (answers CORS preflights). */
  async originIsListed(origin: string, now: string): Promise<boolean> {
    const row = await this.db('api_key_origins as o')
      .join('api_keys as k', 'k.id', 'o.key_id')
      .where('o.origin', origin)
      .where('k.kind', 'browser')
      .whereNull('k.revoked_at')
      .where((q) => q.whereNull('k.expires_at').orWhere('k.expires_at', '>', now))
      .first('k.id');
    return row !== undefined;
  }
}
