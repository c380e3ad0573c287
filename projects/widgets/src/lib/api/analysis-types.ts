import type { ChainModel, Equilibrium } from '@tropline/core/contract';

/** The long-run behaviour of a model, as the API names it. */
export type Regime = 'equilibrium' | 'cycle' | 'chaotic' | 'collapse';

/** An exponent with its batch-means standard error, per model time unit. */
export interface Exponent {
  /** The estimate. */
  readonly value: number;
  /** Its standard error. */
  readonly standardError: number;
}

/** Body of `POST /regimes`. */
export interface RegimeRequest {
  /** The model to assess. */
  readonly model: ChainModel;
  /** Starting value of each level, by id. */
  readonly initial: Readonly<Record<string, number>>;
  /** Discarded time before measuring, in the model's time unit. */
  readonly transient?: number;
  /** Measuring window, in the model's time unit. */
  readonly window?: number;
  /** Initial relative uncertainty of the predictability horizon (e.g. survey precision). */
  readonly initialUncertainty?: number;
  /** Relative uncertainty at which a projection stops being useful. */
  readonly uncertaintyTolerance?: number;
}

/** Answer of `POST /regimes`. */
export interface RegimeResponse {
  /** The regime. */
  readonly regime: Regime;
  /** The largest Lyapunov exponent. */
  readonly lyapunovExponent: Exponent;
  /** Cycle period in the model's time unit (cycles only). */
  readonly period?: number;
  /** Time until an initial uncertainty grows past the tolerance (chaotic only). */
  readonly predictabilityHorizon?: number;
  /** Set when no horizon applies. */
  readonly predictabilityNote?: string;
  /** Ids of the levels that fell below their quasi-extinction threshold (collapse only). */
  readonly collapsedLevels?: readonly string[];
  /** Why the verdict rests on weaker evidence than the exponent alone, when it does. */
  readonly regimeNote?: string;
}

/** Body of `POST /sweeps` (a job). */
export interface SweepRequest {
  /** The baseline model. */
  readonly model: ChainModel;
  /** Starting value of each level, by id. */
  readonly initial: Readonly<Record<string, number>>;
  /** JSON Pointer of the swept parameter, e.g. `/levels/1/handlingTime`. */
  readonly parameter: string;
  /** First value. */
  readonly from: number;
  /** Last value. */
  readonly to: number;
  /** Number of values, evenly spaced. */
  readonly steps: number;
  /** Id of the level whose maxima are recorded. */
  readonly observe: string;
  /** Discarded time per value. */
  readonly transient: number;
  /** Recorded time per value. */
  readonly window: number;
}

/** One value of a bifurcation diagram. */
export interface SweepPoint {
  /** The parameter value. */
  readonly value: number;
  /** Local maxima of the observed level over the window. */
  readonly maxima: readonly number[];
  /** The long-run regime at this value. */
  readonly regime: Regime;
}

/** A sweep's result. */
export interface SweepResult {
  /** One point per parameter value. */
  readonly points: readonly SweepPoint[];
}

/** One change of a scenario: a pointer into `{ model, initial }` and its new value. */
export interface ScenarioChange {
  /** E.g. `/model/harvest/0/rate` or `/initial/fish`. */
  readonly pointer: string;
  /** The new value. */
  readonly value: number;
}

/** Body of `POST /comparisons` (a job). */
export interface ComparisonRequest {
  /** The baseline model. */
  readonly model: ChainModel;
  /** The baseline start. */
  readonly initial: Readonly<Record<string, number>>;
  /** End of every projection. */
  readonly horizon: number;
  /** Final window over which means are taken. */
  readonly window: number;
  /** Number of samples. */
  readonly samples?: number;
  /** Thresholds per level for the time-to-threshold metric. */
  readonly thresholds?: Readonly<Record<string, number>>;
  /** The alternatives, each a named list of changes. */
  readonly scenarios: readonly { readonly name: string; readonly changes: ScenarioChange[] }[];
  /** Discarded time before each regime assessment. */
  readonly regimeTransient?: number;
  /** Measuring window of each regime assessment. */
  readonly regimeWindow?: number;
}

/** One level's comparison metrics. */
export interface LevelOutcome {
  /** Value at the horizon. */
  readonly atHorizon: number;
  /** Mean over the final window. */
  readonly windowMean: number;
  /** Lowest value. */
  readonly minimum: number;
  /** When the lowest value occurs. */
  readonly minimumTime: number;
  /** First time below the threshold, or null if never. */
  readonly thresholdCrossing: number | null;
}

/** One scenario of a comparison's result. */
export interface ScenarioOutcome {
  /** `baseline` or the alternative's name. */
  readonly name: string;
  /** The changes against the baseline. */
  readonly changes: readonly ScenarioChange[];
  /** Metrics by level id. */
  readonly levels: Readonly<Record<string, LevelOutcome>>;
  /** The long-run regime. */
  readonly regime: Regime;
  /** The largest Lyapunov exponent. */
  readonly lyapunovExponent: Exponent;
  /** Sample times. */
  readonly times: readonly number[];
  /** Values per level id. */
  readonly series: Readonly<Record<string, readonly number[]>>;
}

/** A comparison's result: the baseline first, then the alternatives. */
export interface ComparisonResult {
  /** Threshold used per level. */
  readonly thresholds: Readonly<Record<string, number>>;
  /** Baseline, then alternatives in request order. */
  readonly scenarios: readonly ScenarioOutcome[];
}

/** Percentile bands of one level. */
export interface PercentileBands {
  /** 5th percentile per sample time. */
  readonly p5: readonly number[];
  /** 25th percentile. */
  readonly p25: readonly number[];
  /** Median. */
  readonly p50: readonly number[];
  /** 75th percentile. */
  readonly p75: readonly number[];
  /** 95th percentile. */
  readonly p95: readonly number[];
}

/** Status of a background job. */
export type JobStatus = 'queued' | 'running' | 'succeeded' | 'failed';

/** A job as `GET /jobs/{id}` and its event stream show it. */
export interface JobView<T = unknown> {
  /** Job id. */
  readonly id: string;
  /** Route name, e.g. `sweeps`. */
  readonly kind: string;
  /** Where it is. */
  readonly status: JobStatus;
  /** Fraction done, 0..1. */
  readonly progress: number;
  /** The result once succeeded. */
  readonly result?: T;
  /** The problem document once failed. */
  readonly error?: Record<string, unknown>;
  /** Links to the job and its event stream. */
  readonly links?: { readonly self: string; readonly events: string };
}

/** Equilibria answer, as `POST /equilibria` sends it. */
export interface EquilibriaResponse {
  /** Every equilibrium of the chain. */
  readonly equilibria: readonly Equilibrium[];
}
