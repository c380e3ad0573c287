import type { LyapunovResult } from '../lyapunov/lyapunov-spectrum';
import type { LevelTrends } from './level-trend';
import { periodFromLateMaxima } from './period-from-maxima';

/** The long-run behaviour of a chain after its transient. */
export type Regime = 'equilibrium' | 'cycle' | 'chaotic' | 'collapse';

/** Thresholds of the classification; every default is documented in shared/ANALYSES.md. */
export interface RegimeRules {
  /** Quasi-extinction threshold of each level, in its own unit. */
  readonly extinction: ArrayLike<number>;
  /** Standard errors an exponent (or a level's decline rate) must clear to count; default 3. */
  readonly zScore?: number;
  /**
   * Exponents (and levels' decline rates) within ±zeroBand per model time unit count as zero
   * whatever their error; default 1e-3. Finite-window estimates of a cycle's exponent are
   * O(1/window), not 0.
   */
  readonly zeroBand?: number;
  /** Relative spread (max − min)/max over the window under which a level has settled; 1e-6. */
  readonly settledSpread?: number;
  /** Relative tolerance for two maxima of a cycle to be the same; default 1e-4. */
  readonly periodTolerance?: number;
}

/** A regime with the evidence it rests on. */
export interface RegimeVerdict {
  readonly regime: Regime;
  /** Period of the cycle in model time units (cycle only). */
  readonly period?: number;
  /** Maxima per period of the observed level (cycle only): 1, 2, 4 … after period doubling. */
  readonly maximaPerPeriod?: number;
  /** Indices of the levels below their quasi-extinction threshold (collapse only). */
  readonly collapsedLevels?: number[];
  /** Why the verdict rests on weaker evidence than the exponent alone, when it does. */
  readonly note?: string;
}

/** Note given when a level is dying out but has not yet crossed its threshold in the window. */
export const DYING_OUT_NOTE =
  'a level still above its quasi-extinction threshold is declining exponentially toward it ' +
  '(dying out); its maxima are not a cycle or chaos';

/**
 * Fall of a dying level over the window, as a factor: a tenfold steady decline. A persisting
 * level's logarithm is bounded, but a slow transient (an orbit spiralling onto its cycle) moves
 * the mean of ln N by a few tenths over a short window; a decline beyond the rate's error and
 * the zero band alone called such levels dying (seen on the invented upland's wolf sweep).
 */
export const DYING_FALL = 10;

/**
 * Rule 1: the levels that collapse — below their quasi-extinction threshold somewhere in the
 * window (`windowMin`), or dying out: their fitted exponential rate r (see `LevelTrend`) below
 * −max(zScore·SE, zeroBand), and either r·window below −ln {@link DYING_FALL} or (given
 * `attractsWithout`) the chain has an attracting equilibrium without the level and those above
 * it, which the level cannot invade. `dyingOnly` says whether every collapsed level is above its
 * threshold still, i.e. only its decline decides.
 */
export function collapsedLevels(
  windowMin: ArrayLike<number>,
  rules: RegimeRules,
  trends?: LevelTrends,
  attractsWithout?: (lowest: number) => boolean,
): { levels: number[]; dyingOnly: boolean } {
  const n = windowMin.length;
  if (rules.extinction.length !== n) {
    throw new RangeError(`extinction needs one threshold per level (${n})`);
  }
  const z = rules.zScore ?? 3;
  const band = rules.zeroBand ?? 1e-3;
  const levels: number[] = [];
  let dyingOnly = true;
  for (let i = 0; i < n; i++) {
    if (windowMin[i]! < rules.extinction[i]!) {
      levels.push(i);
      dyingOnly = false;
    } else if (
      trends &&
      trends.rates[i]! < -Math.max(z * trends.standardErrors[i]!, band) &&
      (trends.rates[i]! * trends.window < -Math.log(DYING_FALL) || attractsWithout?.(i))
    ) {
      levels.push(i);
    }
  }
  return { levels, dyingOnly };
}

/** What the window showed besides the exponents, for the rules that use it. */
export interface WindowEvidence {
  /** Each level's exponential trend (rule 1's dying out). */
  readonly trends?: LevelTrends;
  /**
   * Whether the window ends on a damped approach to an attracting equilibrium (rule 2; see
   * `endsOnAttractingEquilibrium`); asked only when the earlier tests leave it open.
   */
  readonly damped?: () => boolean;
  /**
   * Whether the chain without level `lowest` and those above it has an attracting equilibrium
   * (rule 1's slow dying out; see `attractingBoundaryWithout`); asked only of a level whose
   * decline is beyond its error but slower than tenfold over the window.
   */
  readonly attractsWithout?: (lowest: number) => boolean;
}

/**
 * Note given when maxima that do not recur drift one way, or are too few to tell: the window
 * holds a transient, not chaos.
 */
export const TRANSIENT_NOTE =
  'the maxima still drift one way or are too few to show chaos (the orbit is still on its way ' +
  'to its long-run state); a longer window settles it';

/**
 * Whether maxima that do not recur are a transient rather than irregular: fewer than 3, or for
 * some lag p ≤ 4 with at least 3 maxima in each of the p interleaved sequences (every p-th
 * maximum), every one of those sequences is monotone (steps within `tolerance` × the largest
 * maximum count either way). An orbit spiralling onto a p-cycle, or onto an equilibrium, gives
 * such sequences; a chaotic orbit's maxima rise and fall at every lag.
 */
export function driftingMaxima(values: readonly number[], tolerance = 1e-4): boolean {
  const m = values.length;
  if (m < 3) return true;
  let top = 0;
  for (const v of values) top = Math.max(top, Math.abs(v));
  const tol = tolerance * top;
  for (let p = 1; p <= 4 && 3 * p <= m; p++) {
    let monotone = true;
    for (let r = 0; r < p && monotone; r++) {
      let up = true;
      let down = true;
      for (let k = r + p; k < m; k += p) {
        const d = values[k]! - values[k - p]!;
        if (d < -tol) up = false;
        if (d > tol) down = false;
      }
      monotone = up || down;
    }
    if (monotone) return true;
  }
  return false;
}

/** Note given when irregular maxima decide a regime the exponent's error leaves open. */
export const IRREGULAR_NOTE =
  'irregular maxima with a positive exponent not yet beyond its error; a longer window settles it';

/**
 * Classifies a run by these rules, in order:
 * 1. `collapse` if any level's minimum over the window is below its quasi-extinction threshold,
 *    or (given `evidence.trends`) a level is dying out: declining exponentially beyond its error
 *    and the zero band, tenfold over the window or toward an attracting equilibrium without it
 *    ({@link collapsedLevels}) — on its way below any threshold, so neither its shrinking maxima
 *    nor the exponent of the levels left describe the long run;
 * 2. `equilibrium` if every level has settled (relative spread below `settledSpread`), the
 *    largest exponent is negative beyond max(zScore·SE, zeroBand), or (given `damped`) the window
 *    ends on a damped approach to an attracting equilibrium — a short window's exponent error
 *    can hide λ < 0 while the damped maxima still pass as a cycle's;
 * 3. `chaotic` if the largest exponent is positive beyond max(zScore·SE, zeroBand);
 * 4. otherwise the exponent is zero within its error: `cycle` when the observed level's
 *    successive maxima recur, over the window or its later half (the period from that
 *    recurrence; `periodFromLateMaxima`); when they do not recur but
 *    drift one way or are too few ({@link driftingMaxima}), `cycle` without a period and with
 *    {@link TRANSIENT_NOTE}; when they are irregular and the exponent's estimate is positive,
 *    `chaotic` with a note that the window was short; else `cycle` without a period (a very
 *    long period, or a torus, which the four regimes fold in).
 */
export function classifyRegime(
  run: LyapunovResult,
  rules: RegimeRules,
  evidence: WindowEvidence = {},
): RegimeVerdict {
  const n = run.windowMin.length;
  const collapsed = collapsedLevels(
    run.windowMin,
    rules,
    evidence.trends,
    evidence.attractsWithout,
  );
  if (collapsed.levels.length > 0) {
    return {
      regime: 'collapse',
      collapsedLevels: collapsed.levels,
      ...(collapsed.dyingOnly ? { note: DYING_OUT_NOTE } : {}),
    };
  }
  const z = rules.zScore ?? 3;
  const band = rules.zeroBand ?? 1e-3;
  const spread = rules.settledSpread ?? 1e-6;
  let settled = true;
  for (let i = 0; i < n; i++) {
    const top = Math.max(Math.abs(run.windowMax[i]!), Number.MIN_VALUE);
    if ((run.windowMax[i]! - run.windowMin[i]!) / top > spread) settled = false;
  }
  const lambda = run.exponents[0]!;
  const margin = Math.max(z * run.standardErrors[0]!, band);
  if (settled || lambda < -margin || evidence.damped?.()) return { regime: 'equilibrium' };
  if (lambda > margin) return { regime: 'chaotic' };
  const p = periodFromLateMaxima(run.maximaTimes, run.maximaValues, rules.periodTolerance ?? 1e-4);
  if (p !== undefined)
    return { regime: 'cycle', period: p.period, maximaPerPeriod: p.maximaPerPeriod };
  if (driftingMaxima(run.maximaValues, rules.periodTolerance ?? 1e-4)) {
    return { regime: 'cycle', note: TRANSIENT_NOTE };
  }
  return lambda > 0 ? { regime: 'chaotic', note: IRREGULAR_NOTE } : { regime: 'cycle' };
}

/** Text given instead of a horizon when the regime does not limit predictability. */
export const NOT_LIMITED_BY_CHAOS = 'not limited by chaos';

/**
 * Predictability horizon ln(Δ/δ0)/λ: the time for an initial relative uncertainty δ0 (default
 * 1 %, e.g. survey precision) to grow past Δ (default 100 %) at the largest exponent λ
 * (Lorenz's error-doubling argument, common practice). Undefined unless λ > 0: a non-chaotic
 * regime is "not limited by chaos".
 */
export function predictabilityHorizon(
  lambda: number,
  initialUncertainty = 0.01,
  tolerance = 1,
): number | undefined {
  if (!(initialUncertainty > 0 && tolerance > initialUncertainty)) {
    throw new RangeError('need 0 < initial uncertainty < tolerance');
  }
  if (!(lambda > 0) || !Number.isFinite(lambda)) return undefined;
  return Math.log(tolerance / initialUncertainty) / lambda;
}
