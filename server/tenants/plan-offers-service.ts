import type { Knex } from 'knex';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError } from '../http/problem';
import type { QuotaPlan } from '../quotas/quotas-repository';
import type { Actor } from './owner-tenant-service';
import { PlanOffersRepository, type PlanOffer } from './plan-offers-repository';

/** An offer in the operator's catalogue, with how many tenants are on it now. */
export interface CatalogueEntry extends PlanOffer {
  readonly tenants: number;
}

/** What the operator sends to offer a plan. */
export interface NewOffer extends QuotaPlan {
  readonly id: string;
  readonly name: string;
  readonly description?: string;
}

function noSuchOffer(id: string): ProblemError {
  return new ProblemError(404, 'not-found', 'No such plan', `No plan has the id "${id}".`);
}

/**
 * The operator's plan catalogue. An offer's numbers are fixed once offered (tenants chose it on
 * those terms); to change them, offer a new plan and withdraw the old one, whose tenants keep
 * it until they choose another. The operator still sets any tenant's numbers directly with
 * `PUT /tenants/{slug}/plan`.
 */
export class PlanOffersService {
  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
  ) {}

  /** Every offer, withdrawn ones included. */
  async catalogue(): Promise<CatalogueEntry[]> {
    const offers = new PlanOffersRepository(this.db);
    const counts = await offers.tenantCounts();
    return (await offers.list(true)).map((o) => ({ ...o, tenants: counts.get(o.id) ?? 0 }));
  }

  /** Offers a new plan to every tenant's owners. */
  async create(input: NewOffer, actor: Actor): Promise<CatalogueEntry> {
    const at = new Date(this.now()).toISOString();
    const offer: PlanOffer = {
      id: input.id,
      name: input.name,
      description: input.description ?? '',
      monthlyUnits: input.monthlyUnits,
      perMinute: input.perMinute,
      browserPerMinute: input.browserPerMinute,
      available: true,
      createdAt: at,
      updatedAt: at,
    };
    await this.db.transaction(async (trx) => {
      if (!(await new PlanOffersRepository(trx).insert(offer))) {
        throw new ProblemError(409, 'conflict', 'Already exists', `A plan "${offer.id}" exists.`, {
          errors: [{ pointer: '/id', message: `the id "${offer.id}" is taken` }],
        });
      }
      await new AuditRepository(trx).record({
        tenantId: null,
        actor: `user:${actor.userId}`,
        action: 'plan-offer.create',
        target: `plan:${offer.id}`,
        detail: {
          monthlyUnits: offer.monthlyUnits,
          perMinute: offer.perMinute,
          browserPerMinute: offer.browserPerMinute,
        },
        at,
        address: actor.address,
      });
    });
    return { ...offer, tenants: 0 };
  }

  /** Renames, redescribes, withdraws or offers again; one audit event when anything changed. */
  async update(
    id: string,
    change: { name?: string; description?: string; available?: boolean },
    actor: Actor,
  ): Promise<CatalogueEntry> {
    const at = new Date(this.now()).toISOString();
    await this.db.transaction(async (trx) => {
      // Write first (a no-op), so SQLite takes its write lock before the read.
      await trx('plan_offers')
        .where({ id })
        .update({ name: trx.ref('name') });
      const offers = new PlanOffersRepository(trx);
      const before = await offers.find(id);
      if (!before) throw noSuchOffer(id);
      const diff: Record<string, { from: unknown; to: unknown }> = {};
      for (const key of ['name', 'description', 'available'] as const) {
        if (change[key] !== undefined && change[key] !== before[key]) {
          diff[key] = { from: before[key], to: change[key] };
        }
      }
      if (Object.keys(diff).length === 0) return;
      await offers.update(id, change, at);
      await new AuditRepository(trx).record({
        tenantId: null,
        actor: `user:${actor.userId}`,
        action: 'plan-offer.update',
        target: `plan:${id}`,
        detail: diff,
        at,
        address: actor.address,
      });
    });
    const entry = (await this.catalogue()).find((o) => o.id === id);
    if (!entry) throw noSuchOffer(id);
    return entry;
  }
}
