import {
  assertComparisonBounds,
  assertEnsembleBounds,
  assertRegimeMapBounds,
  assertSweepBounds,
  comparisonWork,
  ensembleWork,
  regimeMapWork,
  sweepWork,
  validateComparisonRequest,
  validateEnsembleRequest,
  validateRegimeMapRequest,
  validateSweepRequest,
  type ComparisonRequest,
  type EnsembleRequest,
  type RegimeMapRequest,
  type SweepRequest,
} from '@tropline/core';
import type { AnalysisPool } from '@tropline/core/node';
import type { JobKind } from '../jobs/job-kind';
import { workCost } from '../quotas/compute-costs';

/**
 * The four analyses that run as jobs. Each checks its bounds (the engine's, which name the
 * field and the limit) before it is priced, so a request too large is refused before any work.
 */
export function analysisKinds(pool: () => AnalysisPool): JobKind[] {
  const sweeps: JobKind<SweepRequest> = {
    kind: 'sweeps',
    validate: validateSweepRequest,
    cost: (r) => (assertSweepBounds(r), workCost(sweepWork(r))),
    run: (r, ctx) => pool().runSweep(r, ctx),
  };
  const regimeMaps: JobKind<RegimeMapRequest> = {
    kind: 'regime-maps',
    validate: validateRegimeMapRequest,
    cost: (r) => (assertRegimeMapBounds(r), workCost(regimeMapWork(r))),
    run: (r, ctx) => pool().runRegimeMap(r, ctx),
  };
  const ensembles: JobKind<EnsembleRequest> = {
    kind: 'ensembles',
    validate: validateEnsembleRequest,
    cost: (r) => (assertEnsembleBounds(r), workCost(ensembleWork(r))),
    run: (r, ctx) => pool().runEnsemble(r, ctx),
  };
  const comparisons: JobKind<ComparisonRequest> = {
    kind: 'comparisons',
    validate: validateComparisonRequest,
    cost: (r) => (assertComparisonBounds(r), workCost(comparisonWork(r))),
    run: (r, ctx) => pool().runComparison(r, ctx),
  };
  return [sweeps, regimeMaps, ensembles, comparisons] as JobKind[];
}
