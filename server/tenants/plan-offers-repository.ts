import type { Knex } from 'knex';
import type { QuotaPlan } from '../quotas/quotas-repository';

/** A plan the operator offers: a name, a sentence, and the quota numbers it carries. */
export interface PlanOffer extends QuotaPlan {
  readonly id: string;
  readonly name: string;
  readonly description: string;
  /** Whether owners may still choose it (a withdrawn offer stays with tenants already on it). */
  readonly available: boolean;
  readonly createdAt: string;
  readonly updatedAt: string;
}

/** A tenant's plan as stored: the numbers, and the offer they were copied from. */
export interface StoredTenantPlan extends QuotaPlan {
  readonly offerId: string | null;
  readonly updatedAt: string;
}

interface OfferRow {
  id: string;
  name: string;
  description: string;
  monthly_units: number;
  per_minute: number;
  browser_per_minute: number;
  available: boolean | number;
  created_at: string;
  updated_at: string;
}

function toOffer(row: OfferRow): PlanOffer {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    monthlyUnits: Number(row.monthly_units),
    perMinute: Number(row.per_minute),
    browserPerMinute: Number(row.browser_per_minute),
    available: Boolean(row.available),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

/** Whether a tenant's numbers are still exactly those of an offer. */
export function matchesOffer(plan: QuotaPlan, offer: QuotaPlan): boolean {
  return (
    plan.monthlyUnits === offer.monthlyUnits &&
    plan.perMinute === offer.perMinute &&
    plan.browserPerMinute === offer.browserPerMinute
  );
}

/** Storage of the plan catalogue and of which offer a tenant's plan came from. */
export class PlanOffersRepository {
  constructor(private readonly db: Knex | Knex.Transaction) {}

  /** Offers, smallest monthly allowance first; only available ones unless `all`. */
  async list(all = false): Promise<PlanOffer[]> {
    const q = this.db('plan_offers');
    if (!all) q.where({ available: true });
    const rows = await q.orderBy([{ column: 'monthly_units' }, { column: 'id' }]);
    return (rows as OfferRow[]).map(toOffer);
  }

  /** One offer, or undefined. */
  async find(id: string): Promise<PlanOffer | undefined> {
    const row = await this.db('plan_offers').where({ id }).first();
    return row ? toOffer(row as OfferRow) : undefined;
  }

  /** Adds an offer; false when the id is taken. */
  async insert(offer: PlanOffer): Promise<boolean> {
    const inserted = await this.db('plan_offers')
      .insert({
        id: offer.id,
        name: offer.name,
        description: offer.description,
        monthly_units: offer.monthlyUnits,
        per_minute: offer.perMinute,
        browser_per_minute: offer.browserPerMinute,
        available: offer.available,
        created_at: offer.createdAt,
        updated_at: offer.updatedAt,
      })
      .onConflict('id')
      .ignore()
      .returning('id');
    return inserted.length > 0;
  }

  /** Changes an offer's words or availability (never its numbers). */
  async update(
    id: string,
    change: { name?: string; description?: string; available?: boolean },
    at: string,
  ): Promise<void> {
    await this.db('plan_offers')
      .where({ id })
      .update({ ...change, updated_at: at });
  }

  /** A tenant's stored plan, or undefined when none was ever set. */
  async tenantPlan(tenantId: string): Promise<StoredTenantPlan | undefined> {
    const row = await this.db('quota_plans').where({ tenant_id: tenantId }).first();
    return row
      ? {
          monthlyUnits: Number(row.monthly_units),
          perMinute: Number(row.per_minute),
          browserPerMinute: Number(row.browser_per_minute),
          offerId: row.offer_id ?? null,
          updatedAt: row.updated_at,
        }
      : undefined;
  }

  /** Puts a tenant on an offer: its numbers, and where they came from. */
  async putTenantOnOffer(tenantId: string, offer: PlanOffer, at: string): Promise<void> {
    await this.db('quota_plans')
      .insert({
        tenant_id: tenantId,
        monthly_units: offer.monthlyUnits,
        per_minute: offer.perMinute,
        browser_per_minute: offer.browserPerMinute,
        offer_id: offer.id,
        updated_at: at,
      })
      .onConflict('tenant_id')
      .merge();
  }

  /** How many tenants are on each offer now (numbers still matching), by offer id. */
  async tenantCounts(): Promise<Map<string, number>> {
    const rows = await this.db('quota_plans as p')
      .join('plan_offers as o', 'o.id', 'p.offer_id')
      .whereRaw('?? = ??', ['p.monthly_units', 'o.monthly_units'])
      .whereRaw('?? = ??', ['p.per_minute', 'o.per_minute'])
      .whereRaw('?? = ??', ['p.browser_per_minute', 'o.browser_per_minute'])
      .groupBy('o.id')
      .select('o.id')
      .count<{ id: string; n: number }[]>({ n: '*' });
    return new Map(rows.map((r) => [r.id, Number(r.n)]));
  }
}
