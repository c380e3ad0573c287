import { availableParallelism } from 'node:os';
import { type RequestHandler, Router } from 'express';
import type { Knex } from 'knex';
import { KeysService } from '../keys/keys-service';
import { type AnalysisPool, createAnalysisPool } from '@tropline/core/node';
import { analysesRoutes, regimesEndpoint } from '../analyses/analyses-routes';
import { jobsRoutes } from '../jobs/jobs-routes';
import { JobsService } from '../jobs/jobs-service';
import { keysRoutes } from '../keys/keys-routes';
import { ProjectionPool } from '../projections/projection-pool';
import {
  COMPUTE_LIMITS,
  equilibriaEndpoint,
  projectionsRoutes,
  type ComputeLimits,
} from '../projections/projections-routes';
import { ResultCache } from '../projections/result-cache';
import { stampStart, syncCompute } from '../projections/sync-compute';
import { QuotasService } from '../quotas/quotas-service';
import { usageRoutes } from '../quotas/usage-routes';
import { keyCorsPreflight } from './key-cors';
import { keyGuard, type KeyGuard } from './require-key';

/** Worker threads for heavy work: all cores but the one serving requests, 1 to 4. */
export function workerThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism() - 1));
}

/** The keyed part of `/api/v1` and what it holds on to. */
export interface KeyedApi {
  readonly router: Router;
  readonly keys: KeysService;
  readonly quotas: QuotasService;
  readonly jobs: JobsService;
  /**
   * The compute routes (projections, equilibria, the analyses and their jobs) behind another
   * guard, over the same pools, cache and job runner: the console mounts them at
   * `/console/compute` behind a signed-in member's role.
   */
  computeRoutes(guard: KeyGuard): Router;
  /**
   * The open `POST /regimes` and `POST /equilibria` handlers (validation, price, bounds, cache,
   * admission, pool) for routes that build the request body themselves: a published
   * scenario's what-ifs are priced and computed exactly as the open routes.
   */
  readonly analysisHandlers: {
    readonly regimes: RequestHandler;
    readonly equilibria: RequestHandler;
  };
  /** Stops background work (job runner, pool). */
  close(): Promise<void>;
}

/**
 * Everything an API key reaches: CORS preflights for browser keys, keys, usage and the compute
 * routes. Built once per app over its database and clock.
 */
export function keyedApi(
  db: Knex,
  now: () => number,
  limits: Partial<ComputeLimits> = {},
): KeyedApi {
  const keys = new KeysService(db, now);
  const quotas = new QuotasService(db, now);
  const requireKey = keyGuard(keys, now);
  const router = Router();
  router.use(stampStart);
  router.use(keyCorsPreflight(keys, now));
  router.use(keysRoutes(keys, quotas, requireKey));
  router.use(usageRoutes(quotas, requireKey));
  // 64 MB of serialised answers for 10 minutes: the demo portal's repeated views and the
  // bench's repeats hit it; engine answers are deterministic so a hit is exact.
  const cache = new ResultCache({ maxBytes: 64 * 2 ** 20, ttlMs: 10 * 60_000, now });
  const projectionPool = new ProjectionPool(workerThreads());
  const perTenantActive = 4;
  const jobs = new JobsService(db, quotas, now, {
    // Beyond one tenant's bound, so another tenant's job starts beside a flood at once; the
    // analysis pool interleaves running jobs' chunks tenant by tenant.
    concurrency: 2 * perTenantActive,
    perTenantActive,
    maxQueued: 100,
  });
  // The analysis pool's threads start on first use: most test apps never need them.
  let analysisPool: AnalysisPool | undefined;
  const pool = () => (analysisPool ??= createAnalysisPool({ size: workerThreads() }));
  jobs.start();
  const computeRoutes = (guard: KeyGuard) =>
    Router()
      .use(
        projectionsRoutes(quotas, cache, projectionPool, { ...COMPUTE_LIMITS, ...limits }, guard),
      )
      .use(analysesRoutes(jobs, quotas, cache, pool, guard))
      .use(jobsRoutes(jobs, quotas, guard));
  router.use(computeRoutes(requireKey));
  return {
    router,
    keys,
    quotas,
    jobs,
    computeRoutes,
    analysisHandlers: {
      regimes: syncCompute(regimesEndpoint(pool), quotas, cache),
      equilibria: syncCompute(equilibriaEndpoint, quotas, cache),
    },
    close: async () => {
      await jobs.close();
      await projectionPool.close();
      await analysisPool?.close();
      await quotas.close();
    },
  };
}
