import { levelScales } from '../model/chain-kernel';
import { specialiseChain } from '../sweep/specialise-chain';
import { initialVector } from '../model/initial-vector';
import { withParameter } from '../model/parameter-pointer';
import { ModelValidationError } from '../model/validation-issue';
import type { ChainModel } from '../model/chain-model';
import { Dop853 } from '../integrate/dop853';
import { AnalysisRunError, extinctionThresholds } from '../regime/assess-regime';
import { ANALYSIS_LIMITS as L, assertBound } from '../analyses-contract/analysis-limits';
import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import { sampleDistribution } from './distribution';
import { memberGenerator } from './member-generator';
import { crossingTime } from './crossing-time';

/** Sampled trajectories and first quasi-extinction times of a range of members. */
export interface EnsembleMembers {
  /** Member-major, then sample, then level: value of level i at sample s of member m. */
  readonly series: Float64Array;
  /** First time each member's level falls below its threshold (Infinity if never). */
  readonly crossings: Float64Array;
  readonly steps: number;
  readonly evaluations: number;
}

/** Evenly spaced sample times from 0 to the horizon inclusive. */
export function ensembleTimes(horizon: number, samples: number): number[] {
  return Array.from({ length: samples }, (_, s) =>
    s === samples - 1 ? horizon : (horizon * s) / (samples - 1),
  );
}

/** Weighted time units an ensemble integrates (see ANALYSIS_LIMITS). */
export function ensembleWork(req: EnsembleRequest): number {
  return req.members * req.horizon;
}

/** Throws AnalysisBoundsError when the ensemble is too large; call before any work. */
export function assertEnsembleBounds(req: EnsembleRequest): void {
  assertBound('members', '/members', req.members, L.maxMembers);
  assertBound('samples', '/samples', req.samples, L.maxEnsembleSamples);
  assertBound('work', '/members', ensembleWork(req), L.maxWork);
}

/** Member m's model and start: draws parameters, then initial states, from its own stream. */
export function drawMember(
  req: EnsembleRequest,
  m: number,
): { model: ChainModel; y0: Float64Array } {
  const rng = memberGenerator(req.seed, m);
  let model = req.model;
  req.parameters.forEach((p, i) => {
    const at = `/parameters/${i}/distribution`;
    const v = blame(at, m, () => sampleDistribution(p.distribution, rng));
    model = blame(at, m, () => withParameter(model, p.pointer, v));
  });
  const initial: Record<string, number> = { ...req.initial };
  req.initialStates.forEach((s, i) => {
    const at = `/initialStates/${i}/distribution`;
    initial[s.level] = Math.max(
      0,
      blame(at, m, () => sampleDistribution(s.distribution, rng)),
    );
  });
  return { model, y0: initialVector(model, initial) };
}

/**
 * Runs a draw; a bad draw (a truncation that keeps too little, a value that makes the model
 * invalid) becomes a ModelValidationError pointing at the distribution in the request body.
 */
function blame<T>(pointer: string, member: number, draw: () => T): T {
  try {
    return draw();
  } catch (e) {
    const inner = (e as { errors?: readonly { message: string }[] }).errors?.[0]?.message;
    const message = `member ${member}: ${inner ?? (e as Error).message}`;
    throw new ModelValidationError([{ pointer, message }]);
  }
}

/**
 * Runs members [start, end): each draws its parameters and initial state, is integrated by
 * DOP853 to the horizon with the dense output sampled at the sample times, and records the
 * first time each level falls below its quasi-extinction threshold, located by bisection on
 * the dense output. Members are independent, so any split gives the same numbers.
 */
export function runEnsembleMembers(
  req: EnsembleRequest,
  start: number,
  end: number,
): EnsembleMembers {
  const { S, n } = ensembleShape(req);
  const series = new Float64Array((end - start) * S * n);
  const crossings = new Float64Array((end - start) * n);
  const members = Array.from({ length: end - start }, (_, k) => start + k);
  return { series, crossings, ...writeEnsembleMembers(req, members, series, crossings, start) };
}

/** Samples per member (S) and levels (n): member m's block is S·n values of `series`. */
export function ensembleShape(req: EnsembleRequest): { S: number; n: number } {
  return { S: req.samples, n: req.model.levels.length };
}

/**
 * Runs the given members (any order, any subset) and writes member m's samples at block
 * m − `base` of `series` and its crossing times at block m − `base` of `crossings` (both
 * member-major, as {@link EnsembleMembers}), with one integrator for all of them. The pool's
 * workers write straight into shared buffers this way, so members never travel back as copies.
 */
export function writeEnsembleMembers(
  req: EnsembleRequest,
  members: readonly number[],
  series: Float64Array,
  crossings: Float64Array,
  base = 0,
): { steps: number; evaluations: number } {
  const times = ensembleTimes(req.horizon, req.samples);
  const S = times.length;
  const n = req.model.levels.length;
  const stepper = new Dop853(n);
  const y = new Float64Array(n);
  const out = new Float64Array(n);
  // Thresholds belong to the question, not to a member: fixed from the base model.
  const thr = extinctionThresholds(req.model, req.extinction);
  let steps = 0;
  let evaluations = 0;
  for (const m of members) {
    const { model, y0 } = drawMember(req, m);
    const kernel = specialiseChain(model);
    const at = (m - base) * S * n;
    const cAt = (m - base) * n;
    crossings.fill(Number.POSITIVE_INFINITY, cAt, cAt + n);
    for (let i = 0; i < n; i++) {
      series[at + i] = y0[i]!;
      if (y0[i]! < thr[i]!) crossings[cAt + i] = 0;
    }
    let next = 1;
    const r = stepper.integrate(
      kernel.rhs.bind(kernel),
      0,
      y0,
      req.horizon,
      y,
      {
        relativeTolerance: req.tolerance,
        absoluteTolerance: req.tolerance * Math.min(...levelScales(model)),
        attempt: kernel.attempt,
      },
      (step) => {
        while (next < S && times[next]! <= step.tNew) {
          if (times[next] === step.tNew) out.set(step.yNew);
          else step.dense(times[next]!, out);
          series.set(out, at + next * n);
          next++;
        }
        for (let i = 0; i < n; i++) {
          if (crossings[cAt + i] === Number.POSITIVE_INFINITY && step.yNew[i]! < thr[i]!) {
            crossings[cAt + i] = crossingTime(step, i, thr[i]!);
          }
        }
      },
    );
    if (r.outcome !== 'completed') throw new AnalysisRunError(r.outcome);
    steps += r.steps;
    evaluations += r.evaluations;
  }
  return { steps, evaluations };
}
