import { Router } from 'express';
import type { Knex } from 'knex';
import type { QuotasService } from '../quotas/quotas-service';
import { TenantsService } from '../tenants/tenants-service';
import { createTenantBody, planBody } from './account-schemas';
import { requirePlatformAction } from './access-guard';
import { parseBody } from './parse-body';
import { userOf } from './signed-in-user';

/**
 * Platform routes for the signed-in operator: create a tenant, set its plan. They call the same
 * services as the CLI's `create-tenant` and `set-quota`.
 */
export function operatorRoutes(db: Knex, quotas: QuotasService, now: () => number): Router {
  const router = Router();
  const tenants = new TenantsService(db, now);

  router.post('/tenants', requirePlatformAction('tenants:create'), async (req, res) => {
    const body = parseBody(createTenantBody, req.body);
    const tenant = await tenants.create(body.slug, body.name, `user:${userOf(req).id}`);
    res.status(201).location(`/api/v1/tenants/${tenant.slug}`).json(tenant);
  });

  router.put('/tenants/:slug/plan', requirePlatformAction('quotas:set'), async (req, res) => {
    const body = parseBody(planBody, req.body);
    const tenant = await tenants.require(String(req.params.slug));
    res.json(await quotas.setPlan(tenant.id, body, `user:${userOf(req).id}`));
  });
  return router;
}
