import { Router } from 'express';
import {
  findEquilibria,
  projectValidated,
  validateEquilibriaRequest,
  validateProjectionRequest,
  type EquilibriaRequest,
  type ProjectionRequest,
} from '@tropline/core';
import type { KeyGuard } from '../auth/require-key';
import type { QuotasService } from '../quotas/quotas-service';
import { COSTS, projectionCost } from '../quotas/compute-costs';
import type { ResultCache } from './result-cache';
import { syncCompute, type SyncEndpoint } from './sync-compute';

/** Wall time a synchronous projection may take on the request thread, in ms. */
export const PROJECTION_WALL_TIME_MS = 2000;

/** `POST /projections`: the contract's projection, priced by its size. */
export const projectionsEndpoint: SyncEndpoint<ProjectionRequest> = {
  name: 'projections',
  validate: validateProjectionRequest,
  cost: projectionCost,
  compute: (request) => projectValidated(request, { wallTimeMs: PROJECTION_WALL_TIME_MS }),
};

/** `POST /equilibria`: every equilibrium of the chain with its stability. */
export const equilibriaEndpoint: SyncEndpoint<EquilibriaRequest> = {
  name: 'equilibria',
  validate: validateEquilibriaRequest,
  cost: () => COSTS.equilibria,
  compute: (request) => ({ equilibria: findEquilibria(request.model) }),
};

/**
 * The short computations that answer synchronously. Browser keys may call them (the `compute`
 * scope) from their listed origins.
 */
export function projectionsRoutes(
  quotas: QuotasService,
  cache: ResultCache,
  requireKey: KeyGuard,
): Router {
  const router = Router();
  const compute = requireKey('compute');
  router.post('/projections', compute, syncCompute(projectionsEndpoint, quotas, cache));
  router.post('/equilibria', compute, syncCompute(equilibriaEndpoint, quotas, cache));
  return router;
}
