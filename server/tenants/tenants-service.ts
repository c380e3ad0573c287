import type { Knex } from 'knex';
import { ProblemError, validationProblem } from '../http/problem';
import { AuditRepository } from '../audit/audit-repository';
import { QuotasRepository, DEFAULT_PLAN } from '../quotas/quotas-repository';
import { TenantsRepository, type TenantRecord } from './tenants-repository';

const SLUG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** Operator actions on tenants (the CLI's `create-tenant`). */
export class TenantsService {
  private readonly tenants: TenantsRepository;
  private readonly quotas: QuotasRepository;
  private readonly audit: AuditRepository;

  constructor(
    db: Knex,
    private readonly now: () => number = Date.now,
  ) {
    this.tenants = new TenantsRepository(db);
    this.quotas = new QuotasRepository(db);
    this.audit = new AuditRepository(db);
  }

  /** Creates a tenant with the default plan. */
  async create(slug: string, name: string, actor = 'cli'): Promise<TenantRecord> {
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
    if (await this.tenants.findBySlug(slug)) {
      throw new ProblemError(409, 'conflict', 'Already exists', `A tenant "${slug}" exists.`);
    }
    const at = new Date(this.now()).toISOString();
    const tenant = await this.tenants.insert(slug, name.trim(), at);
    await this.quotas.setPlan(tenant.id, DEFAULT_PLAN, at);
    await this.audit.record({
      tenantId: tenant.id,
      actor,
      action: 'tenant.create',
      target: slug,
      at,
    });
    return tenant;
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
