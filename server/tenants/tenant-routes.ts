import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { requirePlatformAction, requireTenantAction } from '../accounts/access-guard';
import { parseBody } from '../accounts/parse-body';
import { accessOf, clientAddress, userOf } from '../accounts/signed-in-user';
import { OwnerTenantService, type Actor } from './owner-tenant-service';
import { PlanOffersService } from './plan-offers-service';
import {
  createOfferBody,
  offerChangeBody,
  planChoiceBody,
  tenantChangeBody,
} from './tenant-schemas';

function actorOf(req: Request): Actor {
  return { userId: userOf(req).id, address: clientAddress(req) };
}

/** A tenant's settings as the API shows them (its id stays internal to the console). */
function settingsView(s: {
  slug: string;
  name: string;
  contactEmail: string | null;
  createdAt: string;
}) {
  return { slug: s.slug, name: s.name, contactEmail: s.contactEmail, createdAt: s.createdAt };
}

/**
 * `/tenant` and `/tenant/plan`: the signed-in owner's own tenant (the one the Tropline-Tenant
 * header names). Actions `tenant:manage` and `plan:manage` of the role matrix.
 */
export function ownerTenantRoutes(db: Knex, now: () => number, afterCommit: () => void): Router {
  const router = Router();
  const owner = new OwnerTenantService(db, now, afterCommit);
  const manage = requireTenantAction('tenant:manage');
  const plan = requireTenantAction('plan:manage');

  router.get('/tenant', manage, async (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.json(settingsView(await owner.settings(accessOf(req).tenantId)));
  });

  router.patch('/tenant', manage, async (req, res) => {
    const body = parseBody(tenantChangeBody, req.body);
    res.json(settingsView(await owner.update(accessOf(req), actorOf(req), body)));
  });

  router.get('/tenant/plan', plan, async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await owner.plan(accessOf(req).tenantId));
  });

  router.put('/tenant/plan', plan, async (req, res) => {
    const body = parseBody(planChoiceBody, req.body);
    res.json(await owner.choose(accessOf(req), actorOf(req), body.offer));
  });
  return router;
}

/** `/plan-offers`: the operator's catalogue of plans owners may choose (`plans:offer`). */
export function planOffersRoutes(db: Knex, now: () => number): Router {
  const router = Router();
  const offers = new PlanOffersService(db, now);
  const offer = requirePlatformAction('plans:offer');

  router.get('/plan-offers', offer, async (_req, res) => {
    res.set('Cache-Control', 'no-store').json({ offers: await offers.catalogue() });
  });

  router.post('/plan-offers', offer, async (req, res) => {
    const body = parseBody(createOfferBody, req.body);
    const created = await offers.create(body, actorOf(req));
    res.status(201).location(`/api/v1/plan-offers/${created.id}`).json(created);
  });

  router.patch('/plan-offers/:id', offer, async (req, res) => {
    const body = parseBody(offerChangeBody, req.body);
    res.json(await offers.update(String(req.params.id), body, actorOf(req)));
  });
  return router;
}
