import { Router } from 'express';
import {
  ANALYSIS_LIMITS,
  AnalysisBoundsError,
  regimeWork,
  validateRegimeRequest,
  type RegimeRequest,
} from '@tropline/core';
import type { AnalysisPool } from '@tropline/core/node';
import type { KeyGuard } from '../auth/require-key';
import { createJobHandler } from '../jobs/jobs-routes';
import type { JobsService } from '../jobs/jobs-service';
import type { ResultCache } from '../projections/result-cache';
import { syncCompute, type SyncEndpoint } from '../projections/sync-compute';
import { workCost } from '../quotas/compute-costs';
import type { QuotasService } from '../quotas/quotas-service';
import { analysisKinds } from './analysis-kinds';

/** Refuses a regime request past the engine's span or work bounds, before any work. */
function assertRegimeBounds(r: RegimeRequest): void {
  const L = ANALYSIS_LIMITS;
  const checks: [AnalysisBoundsError['bound'], string, number, number][] = [
    ['span', '/transient', r.transient ?? 0, L.maxSpan],
    ['span', '/window', r.window ?? 0, L.maxSpan],
    ['work', '/window', regimeWork(r), L.maxWork],
  ];
  for (const [bound, pointer, requested, limit] of checks) {
    if (!(requested <= limit)) throw new AnalysisBoundsError(bound, pointer, requested, limit);
  }
}

/** `POST /regimes`: synchronous for the client, computed on the worker pool. */
export function regimesEndpoint(pool: () => AnalysisPool): SyncEndpoint<RegimeRequest> {
  return {
    name: 'regimes',
    validate: validateRegimeRequest,
    cost: (r) => (assertRegimeBounds(r), workCost(regimeWork(r))),
    compute: (r) => pool().runRegime(r),
  };
}

/**
 * The dynamics analyses: `POST /regimes` answers synchronously (its work runs on the pool),
 * `POST /sweeps`, `/regime-maps`, `/ensembles` and `/comparisons` create jobs.
 */
export function analysesRoutes(
  jobs: JobsService,
  quotas: QuotasService,
  cache: ResultCache,
  pool: () => AnalysisPool,
  requireKey: KeyGuard,
): Router {
  const router = Router();
  const compute = requireKey('compute');
  router.post('/regimes', compute, syncCompute(regimesEndpoint(pool), quotas, cache));
  for (const kind of analysisKinds(pool)) {
    jobs.register(kind);
    router.post(`/${kind.kind}`, compute, createJobHandler(jobs, kind.kind));
  }
  return router;
}
