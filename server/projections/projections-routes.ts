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
import type { ProjectionPool } from './projection-pool';
import type { ResultCache } from './result-cache';
import { onComputeTurn } from './compute-turns';
import { syncCompute, type SyncEndpoint } from './sync-compute';

/** Per-request wall-time bounds of synchronous computations. */
export interface ComputeLimits {
  /** Wall time a short projection may take on the request thread, in ms. */
  readonly inlineWallTimeMs: number;
  /** Wall time of a long projection on a worker thread, in ms. */
  readonly workerWallTimeMs: number;
}

/** The published bounds (openapi.yaml). */
export const COMPUTE_LIMITS: ComputeLimits = { inlineWallTimeMs: 1000, workerWallTimeMs: 10_000 };

/**
 * Projections over at most this many model time units run on the request thread, one per turn
 * of the event loop (the benchmark's 1000 take 5–10 ms); longer ones go to a worker thread.
 */
export const INLINE_MAX_HORIZON = 2000;

/** `POST /projections`: the contract's projection, priced by its size. */
export function projectionsEndpoint(
  pool: ProjectionPool,
  limits: ComputeLimits,
): SyncEndpoint<ProjectionRequest> {
  return {
    name: 'projections',
    validate: validateProjectionRequest,
    cost: projectionCost,
    compute: (request) =>
      request.horizon <= INLINE_MAX_HORIZON
        ? onComputeTurn(() => projectValidated(request, { wallTimeMs: limits.inlineWallTimeMs }))
        : pool.run(request, limits.workerWallTimeMs),
  };
}

/** `POST /equilibria`: every equilibrium of the chain with its stability. */
export const equilibriaEndpoint: SyncEndpoint<EquilibriaRequest> = {
  name: 'equilibria',
  validate: validateEquilibriaRequest,
  cost: () => COSTS.equilibria,
  compute: (request) => onComputeTurn(() => ({ equilibria: findEquilibria(request.model) })),
};

/**
 * The short computations that answer synchronously. Browser keys may call them (the `compute`
 * scope) from their listed origins.
 */
export function projectionsRoutes(
  quotas: QuotasService,
  cache: ResultCache,
  pool: ProjectionPool,
  limits: ComputeLimits,
  requireKey: KeyGuard,
): Router {
  const router = Router();
  const compute = requireKey('compute');
  router.post(
    '/projections',
    compute,
    syncCompute(projectionsEndpoint(pool, limits), quotas, cache),
  );
  router.post('/equilibria', compute, syncCompute(equilibriaEndpoint, quotas, cache));
  return router;
}
