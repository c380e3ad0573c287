import { getParameter, type ChainModel } from '@tropline/core';
import type {
  ComparisonRequest,
  ScenarioChange,
  PercentileBands,
  SweepRequest,
  TrajectoryData,
} from '@tropline/widgets';
import type { ScenarioContent } from './scenario-types';
import type { VersionChange } from './version-fields';

/** What the sweep form asks. */
export interface SweepForm {
  readonly parameter: string;
  readonly from: number;
  readonly to: number;
  readonly steps: number;
  readonly observe: string;
  readonly transient: number;
  readonly window: number;
}

/**
 * A first sweep of a parameter: from half to one and a half times its value in 41 steps,
 * observing the top level, 1000 time units discarded and 500 recorded per value (enough for
 * the benchmark chain to reach its attractor; common practice for a first look, adjustable).
 */
export function defaultSweep(model: ChainModel, parameter: string): SweepForm {
  const value = getParameter(model, parameter);
  const round = (x: number) => Number(x.toPrecision(3));
  return {
    parameter,
    from: round(value * 0.5),
    to: round(value > 0 ? value * 1.5 : 1),
    steps: 41,
    observe: model.levels.at(-1)!.id,
    transient: 1000,
    window: 500,
  };
}

/** The sweep request of the form, over the version's model and start. */
export function sweepRequest(content: ScenarioContent, f: SweepForm): SweepRequest {
  return { model: content.model, initial: content.initial, ...f };
}

/** What the ensemble form asks: which parameters are uncertain and by how much. */
export interface EnsembleForm {
  readonly pointers: readonly string[];
  /** Spread of each as the standard deviation of its logarithm (0.1 ≈ ±10 %). */
  readonly sigma: number;
  readonly members: number;
  readonly seed: number;
}

/** Body of `POST /ensembles`: log-normal uncertainty around each chosen value. */
export function ensembleRequest(content: ScenarioContent, f: EnsembleForm) {
  return {
    model: content.model,
    initial: content.initial,
    horizon: content.horizon,
    samples: 201,
    members: f.members,
    seed: f.seed,
    parameters: f.pointers.map((pointer) => ({
      pointer,
      distribution: {
        kind: 'lognormal' as const,
        median: getParameter(content.model, pointer),
        sigma: f.sigma,
      },
    })),
  };
}

/** An ensemble's answer: percentile bands per level at each sample time. */
export interface EnsembleResult {
  readonly times: readonly number[];
  readonly bands: Readonly<Record<string, PercentileBands>>;
  readonly belowThreshold: Readonly<Record<string, readonly number[]>>;
}

/** The ensemble drawn by the trajectory chart: the median as the line, 5–95 % as the band. */
export function ensembleTrajectory(model: ChainModel, r: EnsembleResult): TrajectoryData {
  return {
    times: r.times,
    timeUnit: model.timeUnit,
    series: model.levels.map((l) => ({
      id: l.id,
      name: `${l.name} (median)`,
      unit: l.unit,
      values: r.bands[l.id]?.p50 ?? [],
    })),
    bands: model.levels.map((l) => ({
      id: l.id,
      lower: r.bands[l.id]?.p5 ?? [],
      upper: r.bands[l.id]?.p95 ?? [],
    })),
  };
}

/** One alternative of the comparison form: a name and one parameter's new value. */
export interface Alternative {
  readonly name: string;
  readonly pointer: string;
  readonly value: number;
}

/**
 * The comparison of the version (baseline) with each alternative, over the version's horizon,
 * means taken over its last quarter.
 */
export function comparisonRequest(
  content: ScenarioContent,
  alternatives: readonly Alternative[],
): ComparisonRequest {
  return {
    model: content.model,
    initial: content.initial,
    horizon: content.horizon,
    window: content.horizon / 4,
    samples: 201,
    scenarios: alternatives.map((a) => ({
      name: a.name.trim() || a.pointer,
      changes: [{ pointer: `/model${a.pointer}`, value: a.value }],
    })),
  };
}

/**
 * The numbers that differ between two versions as changes a comparison can apply to the
 * earlier one: model parameters and starting values. Names, units and structure (a level or
 * a harvest added) are left out, since a comparison varies values of one chain.
 */
export function versionChanges(changes: readonly VersionChange[]): ScenarioChange[] {
  return changes.flatMap((c) =>
    (c.pointer.startsWith('/model/') || c.pointer.startsWith('/initial/')) &&
    typeof c.before === 'number' &&
    typeof c.after === 'number'
      ? [{ pointer: c.pointer, value: c.after }]
      : [],
  );
}

/** The earlier version as the baseline against the later one's values, over the earlier horizon. */
export function versionComparisonRequest(
  before: ScenarioContent,
  later: number,
  changes: readonly VersionChange[],
): ComparisonRequest {
  return {
    ...comparisonRequest(before, []),
    scenarios: [{ name: `Version ${later}`, changes: versionChanges(changes) }],
  };
}
