import type { Knex } from 'knex';
import { emailProblems, normaliseEmail } from '../accounts/email-address';
import type { TenantAccess } from '../accounts/signed-in-user';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem } from '../http/problem';
import { QUOTA_THRESHOLDS } from '../mail/notice-watcher';
import { DEFAULT_PLAN, QuotasRepository } from '../quotas/quotas-repository';
import { nextPeriodStart, periodOf } from '../quotas/quotas-service';
import { matchesOffer, PlanOffersRepository, type PlanOffer } from './plan-offers-repository';
import { TenantsRepository, type TenantChange, type TenantSettings } from './tenants-repository';

/** Who acts and from where, for the audit trail. */
export interface Actor {
  readonly userId: string;
  readonly address: string;
}

/** One offer as an owner weighs it. */
export interface OfferView {
  readonly id: string;
  readonly name: string;
  readonly description: string;
  readonly monthlyUnits: number;
  readonly perMinute: number;
  readonly browserPerMinute: number;
  /** Whether the tenant is on it now. */
  readonly current: boolean;
  /** Whether this month's units so far fit within it (otherwise choosing it is refused). */
  readonly fitsThisMonth: boolean;
}

/** `GET /tenant/plan`: the plan, this month's use, and what else is on offer. */
export interface TenantPlanView {
  readonly current: {
    /** The offer the numbers came from; null when the operator set them directly. */
    readonly offer: { readonly id: string; readonly name: string } | null;
    readonly monthlyUnits: number;
    readonly perMinute: number;
    readonly browserPerMinute: number;
    readonly since: string | null;
  };
  readonly usage: { readonly period: string; readonly used: number; readonly resetsAt: string };
  readonly offers: readonly OfferView[];
}

/**
 * What an owner does to their own tenant: rename it, set the contact address for quota alerts,
 * and move it to another plan on offer. Each change commits with exactly one audit event; a
 * request that changes nothing writes none.
 */
export class OwnerTenantService {
  constructor(
    private readonly db: Knex,
    private readonly now: () => number,
    /** Called once a change that may cross a quota threshold has committed (mail kick). */
    private readonly afterCommit: () => void = () => undefined,
  ) {}

  /** The tenant's settings. */
  async settings(tenantId: string): Promise<TenantSettings> {
    const tenant = await new TenantsRepository(this.db).settings(tenantId);
    if (!tenant) throw new ProblemError(404, 'not-found', 'No such tenant', 'The tenant is gone.');
    return tenant;
  }

  /** Renames the tenant and/or sets its contact address. */
  async update(access: TenantAccess, actor: Actor, change: TenantChange): Promise<TenantSettings> {
    const wanted = normaliseChange(change);
    return this.db.transaction(async (trx) => {
      // Write first, so SQLite takes its write lock before anything is read.
      await trx('tenants')
        .where({ id: access.tenantId })
        .update({ name: trx.ref('name') });
      const tenants = new TenantsRepository(trx);
      const before = (await tenants.settings(access.tenantId))!;
      const diff: Record<string, { from: string | null; to: string | null }> = {};
      if (wanted.name !== undefined && wanted.name !== before.name) {
        diff.name = { from: before.name, to: wanted.name };
      }
      if (wanted.contactEmail !== undefined && wanted.contactEmail !== before.contactEmail) {
        diff.contactEmail = { from: before.contactEmail, to: wanted.contactEmail };
      }
      if (Object.keys(diff).length === 0) return before;
      await tenants.update(access.tenantId, wanted);
      await new AuditRepository(trx).record({
        tenantId: access.tenantId,
        actor: `user:${actor.userId}`,
        action: 'tenant.update',
        target: `tenant:${before.slug}`,
        detail: diff,
        at: new Date(this.now()).toISOString(),
        address: actor.address,
      });
      return (await tenants.settings(access.tenantId))!;
    });
  }

  /** The tenant's plan, this month's units and the offers an owner may choose. */
  async plan(tenantId: string): Promise<TenantPlanView> {
    return planView(this.db, tenantId, this.now());
  }

  /**
   * Moves the tenant to an offer. It takes effect with the next request; the units used this
   * month carry over and count against the new allowance, so a plan whose allowance is below
   * them is refused (409 naming `/offer`). Alerts for thresholds the tenant is no longer past
   * under the new plan are re-armed, so they are sent again if it gets there.
   */
  async choose(access: TenantAccess, actor: Actor, offerId: string): Promise<TenantPlanView> {
    const nowMs = this.now();
    const at = new Date(nowMs).toISOString();
    const period = periodOf(nowMs);
    const changed = await this.db.transaction(async (trx) => {
      // Write first (a no-op), so no admission can slip in between the check and the change.
      await trx('quota_plans')
        .where({ tenant_id: access.tenantId })
        .update({ updated_at: trx.ref('updated_at') });
      const offers = new PlanOffersRepository(trx);
      const offer = await offers.find(offerId);
      if (!offer?.available) throw await notOnOffer(offers, offerId);
      const before = (await offers.tenantPlan(access.tenantId)) ?? {
        ...DEFAULT_PLAN,
        offerId: null,
        updatedAt: at,
      };
      if (before.offerId === offer.id && matchesOffer(before, offer)) return false;
      const used = await new QuotasRepository(trx).used({
        tenantId: access.tenantId,
        period,
      });
      if (offer.monthlyUnits < used) throw belowUsage(offer, used, nowMs);
      await offers.putTenantOnOffer(access.tenantId, offer, at);
      await rearmAlerts(trx, access.tenantId, period, used, offer.monthlyUnits);
      const previous = before.offerId ? await offers.find(before.offerId) : undefined;
      await new AuditRepository(trx).record({
        tenantId: access.tenantId,
        actor: `user:${actor.userId}`,
        action: 'quota.plan-change',
        target: `plan:${offer.id}`,
        detail: {
          from: {
            offer: previous && matchesOffer(before, previous) ? previous.id : null,
            monthlyUnits: before.monthlyUnits,
            perMinute: before.perMinute,
            browserPerMinute: before.browserPerMinute,
          },
          to: {
            offer: offer.id,
            monthlyUnits: offer.monthlyUnits,
            perMinute: offer.perMinute,
            browserPerMinute: offer.browserPerMinute,
          },
          usedThisMonth: used,
        },
        at,
        address: actor.address,
      });
      return true;
    });
    if (changed) this.afterCommit();
    return planView(this.db, access.tenantId, nowMs);
  }
}

function normaliseChange(change: TenantChange): TenantChange {
  if (change.name === undefined && change.contactEmail === undefined) {
    throw validationProblem([
      { pointer: '', message: 'send name, contactEmail or both (contactEmail: null clears it)' },
    ]);
  }
  if (typeof change.contactEmail === 'string') {
    const problems = emailProblems(change.contactEmail, '/contactEmail');
    if (problems.length) throw validationProblem(problems);
    return { ...change, contactEmail: normaliseEmail(change.contactEmail) };
  }
  return change;
}

async function notOnOffer(offers: PlanOffersRepository, offerId: string): Promise<ProblemError> {
  const ids = (await offers.list()).map((o) => o.id);
  return validationProblem([
    {
      pointer: '/offer',
      message: ids.length
        ? `no plan "${offerId}" is on offer; choose one of ${ids.join(', ')}`
        : `no plan "${offerId}" is on offer, and the operator offers none yet`,
    },
  ]);
}

function belowUsage(offer: PlanOffer, used: number, nowMs: number): ProblemError {
  const resetsAt = new Date(nextPeriodStart(nowMs)).toISOString();
  const message =
    `this month's ${used} units already exceed the ${offer.monthlyUnits} of ${offer.name}; ` +
    `choose a larger plan, or this one after ${resetsAt}`;
  return new ProblemError(
    409,
    'plan-below-usage',
    'The plan allows less than this month has used',
    `The tenant has used ${used} compute units this month and ${offer.name} allows ` +
      `${offer.monthlyUnits}; the month's units carry over to a new plan, so it cannot start ` +
      `before the count resets at ${resetsAt}.`,
    { errors: [{ pointer: '/offer', message }], used, allowed: offer.monthlyUnits, resetsAt },
  );
}

/** Forgets this month's alerts for thresholds the tenant is below under a new allowance. */
export async function rearmAlerts(
  trx: Knex.Transaction,
  tenantId: string,
  period: string,
  used: number,
  monthlyUnits: number,
): Promise<void> {
  const below = QUOTA_THRESHOLDS.filter((t) => used * 100 < monthlyUnits * t);
  if (below.length === 0) return;
  await trx('quota_alerts')
    .where({ tenant_id: tenantId, period })
    .whereIn('threshold', [...below])
    .del();
}

async function planView(db: Knex, tenantId: string, nowMs: number): Promise<TenantPlanView> {
  const offers = new PlanOffersRepository(db);
  const period = periodOf(nowMs);
  const stored = await offers.tenantPlan(tenantId);
  const plan = stored ?? { ...DEFAULT_PLAN, offerId: null, updatedAt: null };
  const from = plan.offerId ? await offers.find(plan.offerId) : undefined;
  const onOffer = from && matchesOffer(plan, from) ? from : undefined;
  const used = await new QuotasRepository(db).used({ tenantId, period });
  return {
    current: {
      offer: onOffer ? { id: onOffer.id, name: onOffer.name } : null,
      monthlyUnits: plan.monthlyUnits,
      perMinute: plan.perMinute,
      browserPerMinute: plan.browserPerMinute,
      since: plan.updatedAt,
    },
    usage: { period, used, resetsAt: new Date(nextPeriodStart(nowMs)).toISOString() },
    offers: (await offers.list()).map((o) => ({
      id: o.id,
      name: o.name,
      description: o.description,
      monthlyUnits: o.monthlyUnits,
      perMinute: o.perMinute,
      browserPerMinute: o.browserPerMinute,
      current: o.id === onOffer?.id,
      fitsThisMonth: o.monthlyUnits >= used,
    })),
  };
}
