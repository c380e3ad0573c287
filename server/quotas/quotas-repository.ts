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
  readonly refused?: 'per-minute' | 'monthly-units' | 'open-requests';
  /** Requests counted in the current window, this one included when admitted. */
  readonly requests: number;
  /** Units used this month, this request's included when admitted. */
  readonly used: number;
}

/**
 * Plans and reads of the counters and the ledger. Writes to the counters go through the ledger
 * writer (`ledger-writer.ts`), which admits, refunds and prunes.
 */
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
}
