import type { ChainModel } from '../model/chain-model';
import { specialiseChain } from '../sweep/specialise-chain';
import { levelScales, type ChainKernel } from '../model/chain-kernel';
import { initialVector } from '../model/initial-vector';
import { lyapunovSpectrum, type LyapunovResult } from '../lyapunov/lyapunov-spectrum';
import {
  classifyRegime,
  NOT_LIMITED_BY_CHAOS,
  predictabilityHorizon,
  type Regime,
} from './classify-regime';
import { LevelTrend } from './level-trend';
import { attractingBoundaryWithout, endsOnAttractingEquilibrium } from './attracting-equilibrium';

/** Default quasi-extinction threshold as a fraction of each level's natural scale. */
export const DEFAULT_EXTINCTION_FRACTION = 1e-6;

/** Options of a regime assessment; times in model time units. */
export interface RegimeOptions {
  /** Discarded time before measuring; default 5000. */
  readonly transient?: number;
  /** Measuring window; default 5000. */
  readonly window?: number;
  /** Relative tolerance (absolute: tolerance × each level's scale, smallest); default 1e-8. */
  readonly tolerance?: number;
  /** Exponents to compute, 1 (default) up to the number of levels. */
  readonly exponents?: number;
  /** Quasi-extinction thresholds by level id; default 1e-6 × the level's natural scale. */
  readonly extinction?: Readonly<Record<string, number>>;
  /** Initial relative uncertainty δ0 of the predictability horizon; default 0.01. */
  readonly initialUncertainty?: number;
  /** Relative uncertainty Δ at which a projection stops being useful; default 1. */
  readonly uncertaintyTolerance?: number;
  /** Level id whose maxima give the period; default the top level. */
  readonly observe?: string;
}

/** The answer of a regime assessment (the `/regimes` response plus the evidence). */
export interface RegimeReport {
  readonly regime: Regime;
  /** Largest Lyapunov exponent per model time unit, with its batch-means standard error. */
  readonly lyapunovExponent: { readonly value: number; readonly standardError: number };
  /** Cycle period in model time units (cycle only). */
  readonly period?: number;
  /** Maxima of the observed level per period (cycle only). */
  readonly maximaPerPeriod?: number;
  /** Time for δ0 to grow past Δ, in model time units (chaotic only). */
  readonly predictabilityHorizon?: number;
  /** "not limited by chaos" when no horizon applies. */
  readonly predictabilityNote?: string;
  /** Every exponent computed, largest first, with standard errors. */
  readonly spectrum: { readonly values: number[]; readonly standardErrors: number[] };
  /** Mean divergence of the vector field over the window (equals the spectrum's sum). */
  readonly meanDivergence: number;
  /** Ids of the levels below their quasi-extinction threshold (collapse only). */
  readonly collapsedLevels?: string[];
  /** When the verdict rests on weaker evidence, why (see classifyRegime). */
  readonly regimeNote?: string;
  /** Integrator counters. */
  readonly diagnostics: { readonly steps: number; readonly rhsEvaluations: number };
}

/** Raised when the integration behind an analysis cannot finish (step limit, blow-up). */
export class AnalysisRunError extends Error {
  override readonly name = 'AnalysisRunError';
  constructor(
    /** The integrator's outcome. */
    readonly outcome: string,
  ) {
    super(`the integration did not finish: ${outcome}`);
  }
}

/** Weighted time units of a regime assessment (one tangent vector per exponent asked). */
export function regimeWork(options: RegimeOptions): number {
  const span = (options.transient ?? 5000) + (options.window ?? 5000);
  return span * (1 + 2 * (options.exponents ?? 1));
}

/** Quasi-extinction thresholds in level order from overrides by id and the default fraction. */
export function extinctionThresholds(
  model: ChainModel,
  overrides: Readonly<Record<string, number>> = {},
): Float64Array {
  const scales = levelScales(model);
  return Float64Array.from(
    model.levels,
    (l, i) => overrides[l.id] ?? DEFAULT_EXTINCTION_FRACTION * scales[i]!,
  );
}

/** Regime of a compiled kernel from a start vector; the building block of sweeps and maps. */
export function assessKernel(
  kernel: ChainKernel,
  y0: Float64Array,
  extinction: ArrayLike<number>,
  options: RegimeOptions & { readonly absoluteTolerance: number; readonly observeIndex?: number },
): { report: RegimeReport; run: LyapunovResult } {
  const window = options.window ?? 5000;
  const trend = new LevelTrend(kernel.dimension, window);
  const run = lyapunovSpectrum(
    kernel,
    y0,
    {
      transient: options.transient ?? 5000,
      window,
      exponents: options.exponents ?? 1,
      relativeTolerance: options.tolerance ?? 1e-8,
      absoluteTolerance: options.absoluteTolerance,
      observe: options.observeIndex ?? kernel.dimension - 1,
    },
    (step) => trend.observe(step),
  );
  if (run.outcome !== 'completed') throw new AnalysisRunError(run.outcome);
  const verdict = classifyRegime(
    run,
    { extinction },
    {
      trends: trend.trends(),
      damped: () => endsOnAttractingEquilibrium(kernel, run.state, run.windowMin, run.windowMax),
      attractsWithout: (lowest) =>
        attractingBoundaryWithout(kernel, run.state, run.windowMax, lowest) !== undefined,
    },
  );
  const lambda = run.exponents[0]!;
  const horizon =
    verdict.regime === 'chaotic'
      ? predictabilityHorizon(lambda, options.initialUncertainty, options.uncertaintyTolerance)
      : undefined;
  const report: RegimeReport = {
    regime: verdict.regime,
    lyapunovExponent: { value: lambda, standardError: run.standardErrors[0]! },
    ...(verdict.period !== undefined
      ? { period: verdict.period, maximaPerPeriod: verdict.maximaPerPeriod }
      : {}),
    ...(horizon !== undefined
      ? { predictabilityHorizon: horizon }
      : { predictabilityNote: NOT_LIMITED_BY_CHAOS }),
    ...(verdict.note ? { regimeNote: verdict.note } : {}),
    spectrum: { values: run.exponents, standardErrors: run.standardErrors },
    meanDivergence: run.meanDivergence,
    ...(verdict.collapsedLevels
      ? { collapsedLevels: verdict.collapsedLevels.map((i) => kernel.ids[i]!) }
      : {}),
    diagnostics: { steps: run.steps, rhsEvaluations: run.evaluations },
  };
  return { report, run };
}

/**
 * Classifies the long-run behaviour of a model from an initial state: Benettin exponent(s),
 * the rules of {@link classifyRegime}, the period and the predictability horizon. Throws
 * `ModelValidationError` for a bad initial state and {@link AnalysisRunError} if the
 * integration cannot finish.
 */
export function assessRegime(
  model: ChainModel,
  initial: Readonly<Record<string, number>>,
  options: RegimeOptions = {},
): RegimeReport {
  const y0 = initialVector(model, initial as Record<string, number>);
  const kernel = specialiseChain(model);
  const observeIndex =
    options.observe === undefined ? undefined : kernel.ids.indexOf(options.observe);
  if (observeIndex === -1) throw new RangeError(`observe: no level "${options.observe}"`);
  const scales = levelScales(model);
  const absoluteTolerance = (options.tolerance ?? 1e-8) * Math.min(...scales);
  return assessKernel(kernel, y0, extinctionThresholds(model, options.extinction), {
    ...options,
    absoluteTolerance,
    ...(observeIndex === undefined ? {} : { observeIndex }),
  }).report;
}
