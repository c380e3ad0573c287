import type { ChainKernel } from '../model/chain-kernel';
import { Dop853 } from '../integrate/dop853';
import { AnalysisRunError } from '../regime/assess-regime';
import { crossingTime } from '../ensemble/crossing-time';

/** What a comparison reports for one level of one scenario. */
export interface LevelSummary {
  /** Value at the horizon. */
  readonly atHorizon: number;
  /** Time mean over [horizon − window, horizon]. */
  readonly windowMean: number;
  /** Smallest value over [0, horizon]. */
  readonly minimum: number;
  /** When the minimum occurs. */
  readonly minimumTime: number;
  /** First time below the threshold, or null if never. */
  readonly thresholdCrossing: number | null;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/**
 * Integrates [0, horizon] once with the running integral of every level appended to the state
 * from `windowStart` on (so the window mean is exact to the tolerance, not a sample average),
 * sampling at `times` from the dense output and tracking minima and threshold crossings.
 */
export function trackScenarioLevels(
  kernel: ChainKernel,
  y0: Float64Array,
  thresholds: ArrayLike<number>,
  times: readonly number[],
  windowStart: number,
  tol: { readonly relativeTolerance: number; readonly absoluteTolerance: number },
): { levels: LevelSummary[]; samples: Float64Array } {
  const n = kernel.dimension;
  const horizon = times[times.length - 1]!;
  let accumulate = 0;
  const ys = new Float64Array(n);
  const fs = new Float64Array(n);
  const rhs = (t: number, Y: Float64Array, D: Float64Array): void => {
    for (let i = 0; i < n; i++) ys[i] = Y[i]!;
    kernel.rhs(t, ys, fs);
    for (let i = 0; i < n; i++) {
      D[i] = fs[i]!;
      D[n + i] = accumulate * ys[i]!;
    }
  };
  const Y = new Float64Array(2 * n);
  Y.set(y0);
  const samples = new Float64Array(times.length * n);
  samples.set(y0);
  const minimum = Array.from(y0);
  const minimumTime = Array.from(y0, () => 0);
  const crossing: (number | null)[] = Array.from(y0, (v, i) => (v < thresholds[i]! ? 0 : null));
  const out = new Float64Array(2 * n);
  let next = 1;
  const onStep = (step: Dop853): void => {
    while (next < times.length && times[next]! <= step.tNew) {
      if (times[next] === step.tNew) out.set(step.yNew);
      else step.dense(times[next]!, out);
      samples.set(out.subarray(0, n), next * n);
      next++;
    }
    for (let i = 0; i < n; i++) {
      const v = step.yNew[i]!;
      if (v < minimum[i]!) {
        minimum[i] = v;
        minimumTime[i] = step.tNew;
      }
      if (step.fOld[i]! < 0 && step.fNew[i]! >= 0) refineMinimum(step, i, minimum, minimumTime);
      if (crossing[i] === null && v < thresholds[i]!) {
        crossing[i] = crossingTime(step, i, thresholds[i]!);
      }
    }
  };
  const stepper = new Dop853(2 * n);
  const options = { ...tol, errorComponents: n };
  const start = Math.max(0, Math.min(windowStart, horizon));
  let h = 0;
  if (start > 0) {
    const r = stepper.integrate(rhs, 0, Y, start, Y, options, onStep);
    if (r.outcome !== 'completed') throw new AnalysisRunError(r.outcome);
    h = r.nextStep;
  }
  accumulate = 1;
  const r = stepper.integrate(rhs, start, Y, horizon, Y, { ...options, initialStep: h }, onStep);
  if (r.outcome !== 'completed') throw new AnalysisRunError(r.outcome);
  const span = horizon - start;
  const levels = Array.from({ length: n }, (_, i) => ({
    atHorizon: Y[i]!,
    windowMean: span > 0 ? Y[n + i]! / span : Y[i]!,
    minimum: minimum[i]!,
    minimumTime: minimumTime[i]!,
    thresholdCrossing: crossing[i] ?? null,
  }));
  return { levels, samples };
}

/** Golden-section search of the dense output for an interior minimum of level i. */
function refineMinimum(step: Dop853, i: number, minimum: number[], minimumTime: number[]): void {
  let a = step.tOld;
  let b = step.tNew;
  for (let it = 0; it < 60 && b - a > 1e-13 * Math.max(1, Math.abs(b)); it++) {
    const c = b - GOLDEN * (b - a);
    const d = a + GOLDEN * (b - a);
    if (step.denseComponent(i, c) < step.denseComponent(i, d)) b = d;
    else a = c;
  }
  const t = 0.5 * (a + b);
  const v = step.denseComponent(i, t);
  if (v < minimum[i]!) {
    minimum[i] = v;
    minimumTime[i] = t;
  }
}
