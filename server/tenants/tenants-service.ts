import type { Knex } from 'knex';
import { ProblemError, validationProblem } from '../http/problem';
import { AuditRepository } from '../audit/audit-repository';
import { QuotasRepository, DEFAULT_PLAN, type QuotaPlan } from '../quotas/quotas-repository';
import { periodOf } from '../quotas/quotas-service';
import { rearmAlerts } from './owner-tenant-service';
import { TenantsRepository, type TenantRecord } from './tenants-repository';

const SLUG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** Operator actions on tenants (the CLI's `create-tenant`, the platform routes). */
export class TenantsService {
  private readonly tenants: TenantsRepository;

  constructor(
    private readonly db: Knex,
    private readonly now: () => number = Date.now,
  ) {
    this.tenants = new TenantsRepository(db);
  }

  /** Creates a tenant with the default plan, and its audit event, in one transaction. */
  async create(slug: string, name: string, actor = 'cli', address?: string): Promise<TenantRecord> {
    const errors = [];
    if (!SLUG.test(slug) || slug.length > 64) {
      errors.push({
        pointer: '/slug',
        message: 'slug must be a lowercase slug of at most 64 chars',
      });
    }
    if (!name.trim() || name.length > 200) {
      errors.push({ pointer: '/name', message: 'name must have 1 to 200 characters' });
    }
    if (errors.length) throw validationProblem(errors);
    const at = new Date(this.now()).toISOString();
    return this.db.transaction(async (trx) => {
      const tenants = new TenantsRepository(trx);
      if (await tenants.findBySlug(slug)) {
        throw new ProblemError(409, 'conflict', 'Already exists', `A tenant "${slug}" exists.`, {
          errors: [{ pointer: '/slug', message: `the slug "${slug}" is taken` }],
        });
      }
      const tenant = await tenants.insert(slug, name.trim(), at);
      await new QuotasRepository(trx).setPlan(tenant.id, DEFAULT_PLAN, at);
      await new AuditRepository(trx).record({
        tenantId: tenant.id,
        actor,
        action: 'tenant.create',
        target: slug,
        at,
        address,
      });
      return tenant;
    });
  }

  /**
   * Sets a tenant's quota numbers directly (the operator's `PUT /tenants/{slug}/plan`); fields
   * left out keep their value. The plan then belongs to no offer. Committed with its one
   * `quota.set` event, which carries the operator's address; alerts for thresholds the tenant
   * is now below are re-armed, as when an owner changes plan.
   */
  async setQuota(
    tenant: TenantRecord,
    change: Partial<QuotaPlan>,
    actor: string,
    address?: string,
  ): Promise<QuotaPlan> {
    const nowMs = this.now();
    const at = new Date(nowMs).toISOString();
    return this.db.transaction(async (trx) => {
      // Write first (a no-op), so SQLite takes its write lock before the read.
      await trx('quota_plans')
        .where({ tenant_id: tenant.id })
        .update({ updated_at: trx.ref('updated_at') });
      const quotas = new QuotasRepository(trx);
      const current = (await quotas.getPlan(tenant.id)) ?? DEFAULT_PLAN;
      const given = Object.entries(change).filter(([, v]) => v !== undefined);
      const plan: QuotaPlan = { ...current, ...Object.fromEntries(given) };
      await quotas.setPlan(tenant.id, plan, at);
      const period = periodOf(nowMs);
      const used = await quotas.used({ tenantId: tenant.id, period });
      await rearmAlerts(trx, tenant.id, period, used, plan.monthlyUnits);
      await new AuditRepository(trx).record({
        tenantId: tenant.id,
        actor,
        action: 'quota.set',
        target: `tenant:${tenant.slug}`,
        detail: { ...plan },
        at,
        address,
      });
      return plan;
    });
  }

  /** The tenant with this slug, or a 404 problem naming it. */
  async require(slug: string): Promise<TenantRecord> {
    const tenant = await this.tenants.findBySlug(slug);
    if (!tenant) {
      throw new ProblemError(404, 'not-found', 'No such tenant', `No tenant has slug "${slug}".`);
    }
    return tenant;
  }
}
