import { levelScales } from '../model/chain-kernel';
import { specialiseChain } from './specialise-chain';
import { initialVector } from '../model/initial-vector';
import { withParameter } from '../model/parameter-pointer';
import { Dop853 } from '../integrate/dop853';
import { extinctionThresholds } from '../regime/assess-regime';
import {
  ANALYSIS_LIMITS as L,
  WORK_WEIGHT,
  assertBound,
} from '../analyses-contract/analysis-limits';
import type { SweepRequest } from '../analyses-contract/sweep-contract';
import { sweepPoint, type SweepPoint } from './sweep-point';

/** `steps` values evenly spaced from `from` to `to` inclusive (value i = from + i·Δ). */
export function sweepValues(from: number, to: number, steps: number): number[] {
  return Array.from({ length: steps }, (_, i) =>
    i === steps - 1 ? to : from + ((to - from) * i) / (steps - 1),
  );
}

/** Weighted time units a sweep integrates (see ANALYSIS_LIMITS). */
export function sweepWork(req: SweepRequest): number {
  const weight = req.regimeMethod === 'lyapunov' ? WORK_WEIGHT.exponent : WORK_WEIGHT.state;
  return req.steps * (req.transient + req.window) * weight;
}

/** Throws AnalysisBoundsError when the sweep is too large; call before any work. */
export function assertSweepBounds(req: SweepRequest): void {
  assertBound('sweep-steps', '/steps', req.steps, L.maxSweepSteps);
  assertBound('span', '/transient', req.transient, L.maxSpan);
  assertBound('span', '/window', req.window, L.maxSpan);
  assertBound('work', '/steps', sweepWork(req), L.maxWork);
}

/** Points of a sweep range with the integrator's counters. */
export interface SweepRange {
  readonly points: SweepPoint[];
  readonly steps: number;
  readonly evaluations: number;
}

/**
 * Computes the sweep points with indices [start, end). Without continuation each point starts
 * from `initial`, so any split of the range gives the same points (what makes the pool
 * deterministic); with continuation point i starts where point i-1 ended, so the range must
 * begin at 0 and is run in order.
 */
export function runSweepRange(
  req: SweepRequest,
  start: number,
  end: number,
  onPoint?: (index: number) => void,
): SweepRange {
  if (req.continuation && start !== 0) {
    throw new RangeError('a continued sweep runs from its first value');
  }
  const values = sweepValues(req.from, req.to, req.steps);
  const first = withParameter(req.model, req.parameter, values[start]!);
  const observe = first.levels.findIndex((l) => l.id === req.observe);
  if (observe < 0) throw new RangeError(`observe: no level "${req.observe}"`);
  let y = initialVector(req.model, req.initial as Record<string, number>);
  const stepper = new Dop853(y.length);
  const points: SweepPoint[] = [];
  let steps = 0;
  let evaluations = 0;
  for (let i = start; i < end; i++) {
    const model = withParameter(req.model, req.parameter, values[i]!);
    const run = sweepPoint(
      specialiseChain(model),
      values[i]!,
      req.continuation ? y : initialVector(model, req.initial as Record<string, number>),
      extinctionThresholds(model, req.extinction),
      {
        transient: req.transient,
        window: req.window,
        relativeTolerance: req.tolerance,
        absoluteTolerance: req.tolerance * Math.min(...levelScales(model)),
        observe,
        regimeMethod: req.regimeMethod,
      },
      stepper,
    );
    points.push(run.point);
    steps += run.steps;
    evaluations += run.evaluations;
    if (req.continuation) y = run.state;
    onPoint?.(i);
  }
  return { points, steps, evaluations };
}
