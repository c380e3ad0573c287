import type BetterSqlite3 from 'better-sqlite3';
import type { Knex } from 'knex';
import { bindValues, compileQuery, type CompiledQuery } from '../db/compiled-query';
import type { AdmissionOutcome, AdmissionRequest } from './quotas-repository';

/** One write to the quota tables; a batch of them commits as one transaction. */
export type LedgerOp =
  | { readonly kind: 'admit'; readonly request: AdmissionRequest }
  | { readonly kind: 'refund'; readonly request: AdmissionRequest }
  | { readonly kind: 'prune'; readonly before: number };

/** What an op answers: the counters for an admission, nothing for the others. */
export type LedgerResult = AdmissionOutcome | null;

/** The compiled statements of admission, refund and pruning (plain data: they cross threads). */
export type LedgerQueries = ReturnType<typeof ledgerQueries>;

/**
 * The quota tables' statements, built with Knex for the database's client and compiled once.
 * A counter moves only by a guarded `UPDATE … WHERE value + by <= limit RETURNING value`, so no
 * interleaving of connections or processes can admit past a limit.
 */
export function ledgerQueries(db: Knex) {
  const bump = (table: string, key: Record<string, string>, column: string) => ({
    update: compileQuery(db, [...Object.values(key), 'by', 'limit'], (q, p) =>
      q(table)
        .where(Object.fromEntries(Object.entries(key).map(([c, name]) => [c, p[name]!])))
        .andWhere(q.raw('?? + ?', [column, p.by]), '<=', p.limit)
        .update({ [column]: q.raw('?? + ?', [column, p.by]) })
        .returning(column),
    ),
    // Creates the row on first use; a row that exists (full, or created meanwhile) is left be.
    insert: compileQuery(db, [...Object.values(key), 'by'], (q, p) =>
      q(table)
        .insert({
          ...Object.fromEntries(Object.entries(key).map(([c, name]) => [c, p[name]!])),
          [column]: p.by,
        })
        .onConflict(Object.keys(key))
        .ignore()
        .returning(column),
    ),
  });
  return {
    rate: bump('rate_windows', { key_id: 'keyId', window_start: 'windowStart' }, 'count'),
    units: bump('usage_counters', { tenant_id: 'tenantId', period: 'period' }, 'used'),
    used: compileQuery(db, ['tenantId', 'period'], (q, p) =>
      // By primary key: at most one row, so no `first()` and its bound `LIMIT ?`.
      q('usage_counters').where({ tenant_id: p.tenantId, period: p.period }).select('used'),
    ),
    refund: compileQuery(db, ['tenantId', 'period', 'by'], (q, p) =>
      q('usage_counters')
        .where({ tenant_id: p.tenantId, period: p.period })
        .update({ used: q.raw('?? - ?', ['used', p.by]) }),
    ),
    ledger: compileQuery(
      db,
      ['tenantId', 'keyId', 'period', 'endpoint', 'units', 'cached', 'at'],
      (q, p) =>
        q('usage_ledger').insert({
          tenant_id: p.tenantId,
          key_id: p.keyId,
          period: p.period,
          endpoint: p.endpoint,
          units: p.units,
          cached: p.cached,
          at: p.at,
        }),
    ),
    prune: compileQuery(db, ['before'], (q, p) =>
      q('rate_windows').where('window_start', '<', p.before).delete(),
    ),
  };
}

type Prepared<T> = {
  [K in keyof T]: T[K] extends CompiledQuery ? BetterSqlite3.Statement : Prepared<T[K]>;
};

function prepareAll<T extends object>(conn: BetterSqlite3.Database, queries: T): Prepared<T> {
  return Object.fromEntries(
    Object.entries(queries).map(([name, q]) => [
      name,
      'sql' in q ? conn.prepare((q as CompiledQuery).sql) : prepareAll(conn, q as object),
    ]),
  ) as Prepared<T>;
}

/**
 * The quota tables' statements prepared on one better-sqlite3 connection, and the batch that
 * runs them: every op of a batch in one `BEGIN IMMEDIATE` transaction, so with
 * `synchronous = FULL` a batch costs one wait for the disk however many admissions it holds
 * (group commit). `run` returns only once the commit is durable.
 */
export class LedgerStatements {
  private readonly s: Prepared<LedgerQueries>;
  private readonly batch: (ops: readonly LedgerOp[]) => LedgerResult[];

  constructor(
    conn: BetterSqlite3.Database,
    private readonly q: LedgerQueries,
  ) {
    this.s = prepareAll(conn, q);
    this.batch = conn.transaction((ops: readonly LedgerOp[]) => ops.map((op) => this.apply(op)))
      .immediate as (ops: readonly LedgerOp[]) => LedgerResult[];
  }

  /** Runs the ops in order in one transaction; throws (and writes nothing) if any fails. */
  run(ops: readonly LedgerOp[]): LedgerResult[] {
    return this.batch(ops);
  }

  private apply(op: LedgerOp): LedgerResult {
    if (op.kind === 'prune') {
      this.s.prune.run(bindValues(this.q.prune, op));
      return null;
    }
    const a = op.request;
    if (op.kind === 'refund') {
      this.s.refund.run(bindValues(this.q.refund, { ...a, by: a.cost }));
      this.s.ledger.run(bindValues(this.q.ledger, { ...a, units: -a.cost }));
      return null;
    }
    const requests = this.bump('rate', { ...a, by: 1, limit: a.rateLimit }, 'count');
    if (requests === undefined) {
      return { refused: 'per-minute', requests: a.rateLimit, used: this.used(a) };
    }
    const used = this.bump('units', { ...a, by: a.cost, limit: a.monthlyLimit }, 'used');
    if (used === undefined) return { refused: 'monthly-units', requests, used: this.used(a) };
    this.s.ledger.run(bindValues(this.q.ledger, { ...a, units: a.cost }));
    return { requests, used };
  }

  private used(a: AdmissionRequest): number {
    const row = this.s.used.get(bindValues(this.q.used, a)) as { used: number } | undefined;
    return Number(row?.used ?? 0);
  }

  /** Adds `by` to a counter if it stays within `limit`; the new value, or undefined. */
  private bump(
    counter: 'rate' | 'units',
    values: Record<string, unknown> & { by: number; limit: number },
    column: string,
  ): number | undefined {
    const q = this.q[counter];
    const s = this.s[counter];
    const updated = s.update.get(bindValues(q.update, values)) as Record<string, number>;
    if (updated) return Number(updated[column]);
    if (values.by > values.limit) return undefined;
    // No row yet, or a full one: the transaction holds the write lock, so nothing can create
    // the row in between, and an insert that does nothing means the row is full.
    const inserted = s.insert.get(bindValues(q.insert, values)) as Record<string, number>;
    if (inserted) return values.by;
    return undefined;
  }
}
