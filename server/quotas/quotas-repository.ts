import type { Knex } from 'knex';

/** A tenant's quota plan. */
export interface QuotaPlan {
  /** Compute units per calendar month (UTC). */
  readonly monthlyUnits: number;
  /** Requests per minute for each server key. */
  readonly perMinute: number;
  /** Requests per minute for each browser key (lower: browser keys are public). */
  readonly browserPerMinute: number;
}

/** The plan a new tenant gets. */
export const DEFAULT_PLAN: QuotaPlan = {
  monthlyUnits: 100_000,
  perMinute: 600,
  browserPerMinute: 60,
};

/** One admission attempt: a request of `cost` units by one key. */
export interface AdmissionRequest {
  readonly tenantId: string;
  readonly keyId: string;
  readonly endpoint: string;
  readonly cost: number;
  readonly cached: boolean;
  /** `YYYY-MM` of the calendar month charged. */
  readonly period: string;
  /** Epoch seconds of the current rate window's start. */
  readonly windowStart: number;
  readonly monthlyLimit: number;
  readonly rateLimit: number;
  readonly at: string;
}

/** The counters after an attempt; `refused` says which limit stopped it, if any. */
export interface AdmissionOutcome {
  readonly refused?: 'per-minute' | 'monthly-units';
  /** Requests counted in the current window, this one included when admitted. */
  readonly requests: number;
  /** Units used this month, this request's included when admitted. */
  readonly used: number;
}

/** Storage of plans, counters, rate windows and the usage ledger. */
export class QuotasRepository {
  constructor(readonly db: Knex) {}

  /** Creates or replaces a tenant's plan. */
  async setPlan(tenantId: string, plan: QuotaPlan, at: string): Promise<void> {
    await this.db('quota_plans')
      .insert({
        tenant_id: tenantId,
        monthly_units: plan.monthlyUnits,
        per_minute: plan.perMinute,
        browser_per_minute: plan.browserPerMinute,
        updated_at: at,
      })
      .onConflict('tenant_id')
      .merge();
  }

  /** A tenant's plan, or undefined. */
  async getPlan(tenantId: string): Promise<QuotaPlan | undefined> {
    const row = await this.db('quota_plans').where({ tenant_id: tenantId }).first();
    return row
      ? {
          monthlyUnits: row.monthly_units,
          perMinute: row.per_minute,
          browserPerMinute: row.browser_per_minute,
        }
      : undefined;
  }

  /**
   * Counts the request against the key's rate window and charges the tenant's month. Each
   * counter moves by a single guarded statement (`UPDATE … WHERE used + cost <= limit RETURNING
   * used`), so no interleaving of processes can admit past a limit; the first statement writes,
   * so SQLite takes its write lock before reading anything.
   *
   * Admissions that arrive together share one transaction (group commit): with
   * `synchronous = FULL` every commit waits for the disk, and one wait for a batch keeps
   * throughput up under load. No caller hears "admitted" before the commit is durable.
   */
  admit(a: AdmissionRequest): Promise<AdmissionOutcome> {
    return new Promise((resolve, reject) => {
      this.pending.push({ a, resolve, reject });
      if (this.pending.length === 1) setImmediate(() => void this.flush());
    });
  }

  private pending: {
    a: AdmissionRequest;
    resolve: (o: AdmissionOutcome) => void;
    reject: (e: unknown) => void;
  }[] = [];

  private async flush(): Promise<void> {
    const batch = this.pending.splice(0, 64);
    if (this.pending.length) setImmediate(() => void this.flush());
    try {
      const outcomes = await this.db.transaction(async (trx) => {
        const out: AdmissionOutcome[] = [];
        for (const { a } of batch) out.push(await this.admitOne(trx, a));
        return out;
      });
      batch.forEach((item, i) => item.resolve(outcomes[i]!));
    } catch (err) {
      for (const item of batch) item.reject(err);
    }
  }

  private async admitOne(trx: Knex.Transaction, a: AdmissionRequest): Promise<AdmissionOutcome> {
    const requests = await this.bump(
      trx,
      'rate_windows',
      { key_id: a.keyId, window_start: a.windowStart },
      'count',
      1,
      a.rateLimit,
    );
    if (requests === undefined) {
      return { refused: 'per-minute', requests: a.rateLimit, used: await this.used(a, trx) };
    }
    const where = { tenant_id: a.tenantId, period: a.period };
    const used = await this.bump(trx, 'usage_counters', where, 'used', a.cost, a.monthlyLimit);
    if (used === undefined) {
      return { refused: 'monthly-units', requests, used: await this.used(a, trx) };
    }
    await trx('usage_ledger').insert({
      tenant_id: a.tenantId,
      key_id: a.keyId,
      period: a.period,
      endpoint: a.endpoint,
      units: a.cost,
      cached: a.cached,
      at: a.at,
    });
    return { requests, used };
  }

  /** Gives units back (the computation failed after admission), with a ledger entry. */
  async refund(a: AdmissionRequest): Promise<void> {
    await this.db.transaction(async (trx) => {
      await trx('usage_counters')
        .where({ tenant_id: a.tenantId, period: a.period })
        .update({ used: trx.raw('?? - ?', ['used', a.cost]) });
      await trx('usage_ledger').insert({
        tenant_id: a.tenantId,
        key_id: a.keyId,
        period: a.period,
        endpoint: a.endpoint,
        units: -a.cost,
        cached: a.cached,
        at: a.at,
      });
    });
  }

  /** Units used by a tenant in a month (0 when nothing was charged yet). */
  async used(a: { tenantId: string; period: string }, q: Knex | Knex.Transaction = this.db) {
    const row = await q('usage_counters')
      .where({ tenant_id: a.tenantId, period: a.period })
      .first();
    return Number(row?.used ?? 0);
  }

  /** Sum of the ledger for a tenant and month (what the counter must equal). */
  async ledgerTotal(tenantId: string, period: string): Promise<number> {
    const row = await this.db('usage_ledger')
      .where({ tenant_id: tenantId, period })
      .sum<{ total: number | null }>({ total: 'units' })
      .first();
    return Number(row?.total ?? 0);
  }

  /** Requests a key made in a rate window. */
  async requestsInWindow(keyId: string, windowStart: number): Promise<number> {
    const row = await this.db('rate_windows')
      .where({ key_id: keyId, window_start: windowStart })
      .first();
    return Number(row?.count ?? 0);
  }

  /** Drops rate windows that ended before `before` (they no longer limit anything). */
  async pruneWindows(before: number): Promise<void> {
    await this.db('rate_windows').where('window_start', '<', before).delete();
  }

  /**
   * Adds `by` to one counter row if the result stays within `limit`; creates the row when it
   * does not exist. Returns the new value, or undefined when the limit refuses it.
   */
  private async bump(
    trx: Knex.Transaction,
    table: string,
    where: Record<string, string | number>,
    column: string,
    by: number,
    limit: number,
  ): Promise<number | undefined> {
    for (let attempt = 0; attempt < 2; attempt++) {
      const updated = await trx(table)
        .where(where)
        .andWhere(trx.raw('?? + ?', [column, by]), '<=', limit)
        .update({ [column]: trx.raw('?? + ?', [column, by]) })
        .returning(column);
      if (updated.length > 0) return Number((updated[0] as Record<string, number>)[column]);
      if (by > limit) return undefined;
      const inserted = await trx(table)
        .insert({ ...where, [column]: by })
        .onConflict(Object.keys(where))
        .ignore()
        .returning(column);
      if (inserted.length > 0) return by;
      // A row exists: either it is full, or (PostgreSQL) another process created it between
      // our UPDATE and INSERT; one more UPDATE tells which.
    }
    return undefined;
  }
}
