import { Router } from 'express';
import type { Knex } from 'knex';
import { TenantsService } from '../tenants/tenants-service';
import { createTenantBody, planBody } from './account-schemas';
import { requirePlatformAction } from './access-guard';
import { parseBody } from './parse-body';
import { clientAddress, userOf } from './signed-in-user';

/**
 * Platform routes for the signed-in operator: create a tenant, set its quota numbers. Each
 * commits with its one audit event, which names the operator and their address.
 */
export function operatorRoutes(db: Knex, now: () => number): Router {
  const router = Router();
  const tenants = new TenantsService(db, now);

  router.post('/tenants', requirePlatformAction('tenants:create'), async (req, res) => {
    const body = parseBody(createTenantBody, req.body);
    const actor = `user:${userOf(req).id}`;
    const tenant = await tenants.create(body.slug, body.name, actor, clientAddress(req));
    res.status(201).location(`/api/v1/tenants/${tenant.slug}`).json(tenant);
  });

  router.put('/tenants/:slug/plan', requirePlatformAction('quotas:set'), async (req, res) => {
    const body = parseBody(planBody, req.body);
    const tenant = await tenants.require(String(req.params.slug));
    res.json(await tenants.setQuota(tenant, body, `user:${userOf(req).id}`, clientAddress(req)));
  });
  return router;
}
