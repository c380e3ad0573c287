import type { ChainKernel } from '../model/chain-kernel';
import { Dop853 } from '../integrate/dop853';
import { LocalMaxima } from '../regime/local-maxima';
import { LevelTrend } from '../regime/level-trend';
import { periodFromLateMaxima } from '../regime/period-from-maxima';
import { AnalysisRunError, assessKernel } from '../regime/assess-regime';
import { collapsedLevels, driftingMaxima, type Regime } from '../regime/classify-regime';
import {
  attractingBoundaryWithout,
  endsOnAttractingEquilibrium,
} from '../regime/attracting-equilibrium';

/** How a sweep point's regime is decided. */
export type SweepRegimeMethod = 'maxima' | 'lyapunov';

/** Settings shared by every point of a sweep or cell of a map. */
export interface PointSettings {
  readonly transient: number;
  readonly window: number;
  readonly relativeTolerance: number;
  readonly absoluteTolerance: number;
  /** Index of the observed level. */
  readonly observe: number;
  readonly regimeMethod: SweepRegimeMethod;
}

/** One value of a bifurcation diagram. */
export interface SweepPoint {
  /** The parameter value. */
  readonly value: number;
  /** Local maxima of the observed level over the window, in time order. */
  readonly maxima: number[];
  /** The long-run regime at this value. */
  readonly regime: Regime;
  /** Largest exponent and its error (only with the `lyapunov` regime method). */
  readonly lyapunovExponent?: { readonly value: number; readonly standardError: number };
}

/** A point plus what continuation and the counters need. */
export interface SweepPointRun {
  readonly point: SweepPoint;
  readonly state: Float64Array;
  readonly steps: number;
  readonly evaluations: number;
}

/**
 * Integrates one parameter value: transient, then the window while recording the observed
 * level's local maxima from the dense output. With the `maxima` method the regime follows from
 * the window alone (collapse below a threshold or dying out, as rule 1 of `classifyRegime`;
 * equilibrium when every level has settled or the window ends on a damped approach to an
 * attracting equilibrium (`endsOnAttractingEquilibrium`); cycle when the maxima recur (over the window or
 * its later half) or drift one way (`driftingMaxima`: an orbit still approaching its cycle); otherwise chaotic, i.e.
 * irregular maxima); with `lyapunov` it is the
 * Benettin classification of {@link assessKernel} (about 3× the work).
 */
export function sweepPoint(
  kernel: ChainKernel,
  value: number,
  y0: Float64Array,
  extinction: ArrayLike<number>,
  s: PointSettings,
  stepper: Dop853 = new Dop853(kernel.dimension),
): SweepPointRun {
  if (s.regimeMethod === 'lyapunov') {
    const { report, run } = assessKernel(kernel, y0, extinction, {
      transient: s.transient,
      window: s.window,
      tolerance: s.relativeTolerance,
      absoluteTolerance: s.absoluteTolerance,
      observeIndex: s.observe,
    });
    return {
      point: {
        value,
        maxima: settledMaxima(run.windowMin, run.windowMax, s.observe) ?? run.maximaValues,
        regime: report.regime,
        lyapunovExponent: report.lyapunovExponent,
      },
      state: run.state,
      steps: run.steps,
      evaluations: run.evaluations,
    };
  }
  const n = kernel.dimension;
  const rhs = kernel.rhs.bind(kernel);
  const y = Float64Array.from(y0);
  const options = {
    relativeTolerance: s.relativeTolerance,
    absoluteTolerance: s.absoluteTolerance,
    attempt: kernel.attempt,
  };
  let steps = 0;
  let evaluations = 0;
  let h = 0;
  if (s.transient > 0) {
    const r = stepper.integrate(rhs, 0, y, s.transient, y, options);
    if (r.outcome !== 'completed') throw new AnalysisRunError(r.outcome);
    steps += r.steps;
    evaluations += r.evaluations;
    h = r.nextStep;
  }
  const min = Array.from(y);
  const max = Array.from(y);
  const maxima = new LocalMaxima(s.observe);
  const trend = new LevelTrend(n, s.window);
  const r = stepper.integrate(rhs, 0, y, s.window, y, { ...options, initialStep: h }, (step) => {
    const yn = step.yNew;
    for (let i = 0; i < n; i++) {
      const v = yn[i]!;
      if (v < min[i]!) min[i] = v;
      else if (v > max[i]!) max[i] = v;
    }
    maxima.observe(step);
    trend.observe(step);
  });
  if (r.outcome !== 'completed') throw new AnalysisRunError(r.outcome);
  steps += r.steps;
  evaluations += r.evaluations;
  const values = maxima.maximaValues();
  return {
    point: {
      value,
      maxima: settledMaxima(min, max, s.observe) ?? values,
      regime: maximaRegime(
        min,
        max,
        extinction,
        trend,
        maxima,
        values,
        () => endsOnAttractingEquilibrium(kernel, y, min, max),
        (lowest) => attractingBoundaryWithout(kernel, y, max, lowest) !== undefined,
      ),
    },
    state: y,
    steps,
    evaluations,
  };
}

/** Relative spread under which a level counts as settled (as in classifyRegime). */
const SETTLED_SPREAD = 1e-6;

const settled = (min: number, max: number) =>
  (max - min) / Math.max(Math.abs(max), Number.MIN_VALUE) <= SETTLED_SPREAD;

/**
 * On a settled equilibrium the "maxima" are rounding-level wiggles; the diagram shows the
 * equilibrium value instead, as one maximum.
 */
function settledMaxima(min: readonly number[], max: readonly number[], i: number) {
  return settled(min[i]!, max[i]!) ? [max[i]!] : undefined;
}

function maximaRegime(
  min: readonly number[],
  max: readonly number[],
  extinction: ArrayLike<number>,
  trend: LevelTrend,
  maxima: LocalMaxima,
  values: readonly number[],
  damped: () => boolean,
  attractsWithout: (lowest: number) => boolean,
): Regime {
  const collapsed = collapsedLevels(min, { extinction }, trend.trends(), attractsWithout);
  if (collapsed.levels.length > 0) return 'collapse';
  let all = true;
  for (let i = 0; i < min.length; i++) if (!settled(min[i]!, max[i]!)) all = false;
  if (all || values.length < 3 || damped()) return 'equilibrium';
  if (periodFromLateMaxima(maxima.maximaTimes(), values, 1e-4)) return 'cycle';
  // Maxima drifting one way are an orbit still approaching its cycle, not chaos.
  return driftingMaxima(values) ? 'cycle' : 'chaotic';
}
