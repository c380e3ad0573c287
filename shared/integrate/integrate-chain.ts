import { Outcome, Solver } from 'odex';
import { ENGINE_LIMITS } from '../contract/limits';
import { IntegrationError, type IntegrationDiagnostics } from './integration-error';
import { odexDerivative, type OdeKernel } from './odex-derivative';

/** ODEX's dense interpolant of the last accepted step: component index, time → value. */
export type DenseInterpolant = (component: number, t: number) => number;

/** Options of {@link integrateChain}. Every budget has a default from ENGINE_LIMITS. */
export interface IntegrateOptions {
  /** Start time; default 0. */
  readonly t0?: number;
  /** End time (> t0). */
  readonly t1: number;
  /** Relative tolerance; default 1e-8. */
  readonly tolerance?: number;
  /** Absolute tolerance, scalar or per component; default `tolerance · scales[i]`. */
  readonly absoluteTolerance?: number | ArrayLike<number>;
  /** Natural magnitude of each component (absolute floor, blow-up bound); default all 1. */
  readonly scales?: ArrayLike<number>;
  /** Step budget; default ENGINE_LIMITS.maxSteps. */
  readonly maxSteps?: number;
  /** Wall-time budget in ms; default ENGINE_LIMITS.defaultWallTimeMs. */
  readonly wallTimeMs?: number;
  /** How many leading components are population levels that must stay ≥ 0; default all. */
  readonly nonNegative?: number;
  /** Names of components for error messages (e.g. level ids). */
  readonly ids?: readonly string[];
  /** Increasing times in [t0, t1] at which to report the dense solution through `onSample`. */
  readonly sampleTimes?: ArrayLike<number>;
  /** Receives each sample; `y` is a reused buffer, copy what you keep. */
  readonly onSample?: (index: number, t: number, y: Float64Array) => void;
  /** Called after every accepted step with ODEX's dense interpolant; return false to stop. */
  readonly onStep?: (
    tOld: number,
    t: number,
    y: readonly number[],
    dense: DenseInterpolant,
  ) => boolean | void;
  /**
   * Components ODEX keeps dense output for (0-based); default all. Fewer is cheaper; samples of
   * the others read NaN except at step ends.
   */
  readonly denseComponents?: readonly number[];
  /** Clock in ms; default `performance.now`. */
  readonly now?: () => number;
}

/** What {@link integrateChain} returns on success. */
export interface IntegrateResult {
  /** State at `t`. */
  readonly y: Float64Array;
  /** Time reached: t1, or earlier if `onStep` returned false. */
  readonly t: number;
  /** Counters. */
  readonly diagnostics: IntegrationDiagnostics;
}

/** Blow-up bound as a multiple of a component's scale (or start value, if larger). */
export const BLOW_UP_FACTOR = 1e12;
/**
 * A level below −NEGATIVE_SLACK·atol is an error; in [−NEGATIVE_SLACK·atol, 0) it reads as 0.
 * The chain's equations keep every level ≥ 0 exactly, so small negatives are the integrator's
 * noise around an extinct level (seen down to −14·atol when a quota drives a producer out).
 */
export const NEGATIVE_SLACK = 1000;

/**
 * Integrates y' = f(t, y) with ODEX (Hairer–Wanner extrapolation, via odex) from t0 to t1 with
 * dense output. Bounded: a step budget, a wall-time budget, a blow-up bound, a non-finite check
 * and a non-negativity check on population components, each ending in an
 * {@link IntegrationError} that names the cause. Never mutates `y0`.
 */
export function integrateChain(
  kernel: OdeKernel,
  y0: ArrayLike<number>,
  options: IntegrateOptions,
): IntegrateResult {
  const n = kernel.dimension;
  const t0 = options.t0 ?? 0;
  const t1 = options.t1;
  const rtol = options.tolerance ?? ENGINE_LIMITS.defaultTolerance;
  const scales = Float64Array.from({ length: n }, (_, i) => {
    const s = options.scales?.[i] ?? 1;
    return s > 0 && Number.isFinite(s) ? s : 1;
  });
  const atol = Float64Array.from({ length: n }, (_, i) => {
    const a = options.absoluteTolerance;
    return a === undefined ? rtol * scales[i]! : typeof a === 'number' ? a : a[i]!;
  });
  const nonNegative = Math.min(n, options.nonNegative ?? n);
  const bound = Float64Array.from(
    { length: n },
    (_, i) => BLOW_UP_FACTOR * Math.max(scales[i]!, Math.abs(y0[i]!)),
  );
  const now = options.now ?? (() => performance.now());
  const wallTimeMs = options.wallTimeMs ?? ENGINE_LIMITS.defaultWallTimeMs;
  const deadline = now() + wallTimeMs;
  const name = (i: number): string => options.ids?.[i] ?? `component ${i}`;

  let accepted = 0;
  let steps = 0;
  let rejected = 0;
  let tReached = t0;
  let failure: IntegrationError | undefined;
  const diagnostics = (): IntegrationDiagnostics => ({
    steps,
    accepted,
    rejected,
    rhsEvaluations: deriv.evaluations(),
  });
  const fail = (
    code: IntegrationError['code'],
    message: string,
    t: number,
    i?: number,
  ): IntegrationError =>
    new IntegrationError(
      code,
      message,
      t,
      diagnostics(),
      i,
      i === undefined ? undefined : options.ids?.[i],
    );

  const deriv = odexDerivative(kernel, () => {
    if (now() > deadline) {
      throw fail(
        'time-limit',
        `the wall-time budget of ${wallTimeMs} ms ran out at t = ${tReached}`,
        tReached,
      );
    }
  });

  const solver = new Solver(n);
  solver.relativeTolerance = rtol;
  solver.absoluteTolerance = Array.from(atol);
  solver.maxSteps = options.maxSteps ?? ENGINE_LIMITS.maxSteps;
  solver.denseOutput = true;
  if (options.denseComponents) solver.denseComponents = [...options.denseComponents];

  const times = options.sampleTimes;
  // Components without dense output read NaN between step ends.
  const denseMask = new Uint8Array(n).fill(options.denseComponents ? 0 : 1);
  for (const c of options.denseComponents ?? []) denseMask[c] = 1;
  const sample = new Float64Array(n);
  let next = 0;
  const emit = (t: number, value: (i: number) => number): void => {
    for (let i = 0; i < n; i++) {
      let v = value(i);
      if (i < nonNegative && v < 0 && v >= -NEGATIVE_SLACK * atol[i]!) v = 0;
      // (NaN for components left out of denseComponents passes through unchanged.)
      sample[i] = v;
    }
    options.onSample?.(next, t, sample);
    next++;
  };

  const check = (t: number, y: readonly number[]): IntegrationError | undefined => {
    for (let i = 0; i < n; i++) {
      const v = y[i]!;
      if (!Number.isFinite(v))
        return fail('non-finite', `${name(i)} became non-finite at t = ${t}`, t, i);
      if (Math.abs(v) > bound[i]!) {
        return fail(
          'blow-up',
          `${name(i)} grew past ${bound[i]!.toExponential(2)} at t = ${t} (blow-up)`,
          t,
          i,
        );
      }
      if (i < nonNegative && v < -NEGATIVE_SLACK * atol[i]!) {
        return fail('negative-level', `${name(i)} turned negative (${v}) at t = ${t}`, t, i);
      }
    }
    return undefined;
  };

  let stoppedByCaller = false;
  const solOut = (
    nr: number,
    tOld: number,
    t: number,
    y: number[],
    dense?: DenseInterpolant,
  ): boolean => {
    tReached = t;
    if (nr === 1) {
      failure = check(t, y);
      if (failure) return false;
      if (times) while (next < times.length && times[next]! <= t) emit(times[next]!, (i) => y[i]!);
      return true;
    }
    accepted = nr - 1;
    failure = check(t, y);
    if (failure) return false;
    if (times && dense) {
      while (next < times.length && times[next]! <= t) {
        const ts = times[next]!;
        emit(ts, ts === t ? (i) => y[i]! : (i) => (denseMask[i] ? dense(i, ts) : NaN));
      }
    }
    if (options.onStep && dense && options.onStep(tOld, t, y, dense) === false) {
      stoppedByCaller = true;
      return false;
    }
    if (now() > deadline) {
      failure = fail(
        'time-limit',
        `the wall-time budget of ${wallTimeMs} ms ran out at t = ${t}`,
        t,
      );
      return false;
    }
    return true;
  };

  const result = solver.solve(deriv.f, t0, Array.from(y0), t1, solOut);
  steps = result.nStep;
  rejected = result.nReject;
  accepted = result.nAccept;
  if (failure)
    throw new IntegrationError(
      failure.code,
      failure.message,
      failure.time,
      diagnostics(),
      failure.levelIndex,
      failure.levelId,
    );
  if (result.outcome === Outcome.MaxStepsExceeded) {
    throw fail(
      'step-limit',
      `the step budget of ${solver.maxSteps} steps ran out at t = ${tReached}`,
      tReached,
    );
  }
  if (times)
    while (next < times.length && times[next]! <= t1 && !stoppedByCaller)
      emit(times[next]!, (i) => result.y[i]!);
  return {
    y: Float64Array.from(result.y),
    t: stoppedByCaller ? tReached : t1,
    diagnostics: diagnostics(),
  };
}
