import { PROJECTION_CAUTIONS } from '../contract/cautions';
import { ENGINE_LIMITS } from '../contract/limits';
import { validateProjectionRequest, type ProjectionRequest } from '../contract/projection-request';
import type { ProjectionResponse } from '../contract/projection-response';
import { compileChain, levelScales } from '../model/chain-kernel';
import { ModelValidationError } from '../model/validation-issue';
import { integrateChain } from './integrate-chain';

/** Budgets a caller (the server, a worker) may tighten for one projection. */
export interface ProjectOptions {
  /** Wall-time budget in ms; default ENGINE_LIMITS.defaultWallTimeMs. */
  readonly wallTimeMs?: number;
  /** Step budget; default ENGINE_LIMITS.maxSteps (never more). */
  readonly maxSteps?: number;
  /** Clock in ms, for tests; default `performance.now`. */
  readonly now?: () => number;
}

/**
 * How far below its scale a level is still followed to the relative tolerance: the absolute
 * floor is `tolerance · ABSOLUTE_FLOOR_FRACTION · min(1, S)`. A consumer crash drives its prey
 * exponentially close to zero; with a floor equal to the tolerance the integrator stops
 * resolving it there, it can cross zero, and since the equations are linear in each level near
 * zero it then grows the wrong way (the "atto-fox" problem). 1e-4 fixed every such case found by
 * the property tests for +6 % RHS evaluations on the benchmark.
 */
export const ABSOLUTE_FLOOR_FRACTION = 1e-4;

/** Per-level absolute tolerances for a relative tolerance (see ABSOLUTE_FLOOR_FRACTION). */
export function absoluteFloor(tolerance: number, scales: ArrayLike<number>): Float64Array {
  return Float64Array.from(scales, (s) => tolerance * ABSOLUTE_FLOOR_FRACTION * Math.min(1, s));
}

/** The `samples` evenly spaced times from 0 to `horizon` inclusive (the last exactly horizon). */
export function sampleTimes(horizon: number, samples: number): Float64Array {
  const out = new Float64Array(samples);
  for (let k = 0; k < samples; k++) out[k] = (horizon * k) / (samples - 1);
  out[samples - 1] = horizon;
  return out;
}

/**
 * Projects a chain: validates the request body (throwing {@link ModelValidationError} with
 * body-relative pointers), integrates with ODEX at the requested tolerance (absolute floor
 * from {@link absoluteFloor}) and samples the dense solution at evenly spaced
 * times. Throws {@link IntegrationError} (code `step-limit`, `time-limit`, `blow-up`,
 * `non-finite` or `negative-level`) when it cannot finish. Deterministic.
 */
export function project(request: unknown, options: ProjectOptions = {}): ProjectionResponse {
  const checked = validateProjectionRequest(request);
  if (!checked.ok) throw new ModelValidationError(checked.errors);
  return projectValidated(checked.value, options);
}

/** {@link project} for a request already validated (e.g. by the server's middleware). */
export function projectValidated(
  req: ProjectionRequest,
  options: ProjectOptions = {},
): ProjectionResponse {
  const kernel = compileChain(req.model);
  const n = kernel.dimension;
  const scales = levelScales(req.model);
  const times = sampleTimes(req.horizon, req.samples);
  const columns = Array.from({ length: n }, () => new Array<number>(req.samples));
  const result = integrateChain(
    kernel,
    req.model.levels.map((l) => req.initial[l.id]!),
    {
      t1: req.horizon,
      tolerance: req.tolerance,
      scales,
      absoluteTolerance: absoluteFloor(req.tolerance, scales),
      maxSteps: Math.min(options.maxSteps ?? ENGINE_LIMITS.maxSteps, ENGINE_LIMITS.maxSteps),
      wallTimeMs: options.wallTimeMs ?? ENGINE_LIMITS.defaultWallTimeMs,
      ids: kernel.ids,
      sampleTimes: times,
      onSample: (k, _t, y) => {
        for (let i = 0; i < n; i++) columns[i]![k] = y[i]!;
      },
      ...(options.now ? { now: options.now } : {}),
    },
  );
  const series: Record<string, number[]> = {};
  kernel.ids.forEach((id, i) => {
    series[id] = columns[i]!;
  });
  return {
    times: Array.from(times),
    series,
    diagnostics: { ...result.diagnostics, tolerance: req.tolerance },
    cautions: [...PROJECTION_CAUTIONS],
  };
}
