import type { ProjectionRequest } from '@tropline/core';

/**
 * Compute units per endpoint: the published price list (also in openapi.yaml, "Quotas").
 * Costs grow with the work a request asks for, so a tenant's monthly units bound its load.
 */
export const COSTS = {
  /** A cached answer (identical request within the cache's lifetime): 1 unit. */
  cached: 1,
  /** Equilibria of a chain: 1 unit. */
  equilibria: 1,
} as const;

/**
 * A projection costs `ceil(horizon / 1000) + ceil(samples × levels / 10000)` units: the first
 * term follows integration work, the second the size of the answer. The benchmark chain over
 * 1000 time units with 1001 samples costs 2.
 */
export function projectionCost(req: Pick<ProjectionRequest, 'horizon' | 'samples' | 'model'>) {
  return (
    Math.ceil(req.horizon / 1000) + Math.ceil((req.samples * req.model.levels.length) / 10_000)
  );
}

/**
 * Analyses are priced by the weighted model time they integrate (the engine's work measure:
 * time units × 1 for the state, × 3 with a tangent vector, × 6 with the full spectrum):
 * one unit per 2000 weighted time units, at least 1.
 */
export function workCost(weightedTimeUnits: number): number {
  return Math.max(1, Math.ceil(weightedTimeUnits / 2000));
}
