import { Dop853 } from '../integrate/dop853';
import type { Dop853Options } from '../integrate/dop853-options';
import type { ChainModel } from '../model/chain-model';
import { levelScales, type ChainKernel } from '../model/chain-kernel';
import { ModelValidationError } from '../model/validation-issue';
import { specialiseChain } from '../sweep/specialise-chain';
import type { CalibrationRequest } from './calibration-request';

/** One observed value the fit compares with the model: log scale, with its weight 1/σ. */
export interface FitPoint {
  readonly row: number;
  readonly level: number;
  readonly time: number;
  readonly observed: number;
  readonly logObserved: number;
  /** 1/σ of the log observation: se/value by the delta method, or 1 without standard errors. */
  readonly weight: number;
}

/**
 * A stretch of the data integrated in one go, from `t0` to `t1`, predicting `points` (indices
 * into the point list). A whole-span window starts from the scenario's (fitted) initial state
 * at t = 0; a segment starts at its first surveyed row from a state that is itself fitted,
 * beginning at `guess` (the surveyed values there), so the start row's own observations are
 * data like any other rather than a noiseless truth.
 */
export interface FitWindow {
  readonly t0: number;
  readonly t1: number;
  /** Segments only: the first guess of the start state (one value per level, all > 0). */
  readonly guess?: Float64Array;
  /** Segments only: which levels of the guess were observed at the start row (else filled). */
  readonly observedAtStart?: readonly boolean[];
  readonly points: readonly number[];
}

/** The points and windows of a calibration, built once. */
export interface FitLayout {
  readonly points: readonly FitPoint[];
  readonly windows: readonly FitWindow[];
  /** Whether the windows are segments (each with its own fitted start). */
  readonly segmented: boolean;
  /** Observations of exactly zero, which have no logarithm and are left out of the fit. */
  readonly zerosSkipped: number;
}

/** Most segments of one fit (each adds one fitted start value per level). */
export const MAX_SEGMENTS = 100;

/** Flattens the observations into fit points and cuts them into windows. */
export function fitLayout(req: CalibrationRequest): FitLayout {
  const ids = req.model.levels.map((l) => l.id);
  const { times, levels, standardErrors } = req.observations;
  const points: FitPoint[] = [];
  let zerosSkipped = 0;
  times.forEach((time, row) => {
    ids.forEach((id, level) => {
      const value = levels[id]?.[row];
      if (value === null || value === undefined) return;
      if (value === 0) {
        zerosSkipped++;
        return;
      }
      const se = standardErrors?.[id]?.[row];
      const sigma = se !== null && se !== undefined && se > 0 ? se / value : 1;
      points.push({
        row,
        level,
        time,
        observed: value,
        logObserved: Math.log(value),
        weight: 1 / sigma,
      });
    });
  });
  if (req.segmentLength === undefined) {
    return {
      points,
      windows: [{ t0: 0, t1: times.at(-1)!, points: points.map((_, i) => i) }],
      segmented: false,
      zerosSkipped,
    };
  }
  return { ...segmentWindows(req, points), segmented: true, zerosSkipped };
}

/**
 * Cuts the rows into segments of `segmentLength` from the first survey. Each segment starts
 * at its first row with any positive observation; a level missed there is guessed by
 * log-linear interpolation between its neighbouring surveys (the nearest one at the ends).
 */
function segmentWindows(req: CalibrationRequest, all: readonly FitPoint[]) {
  const ids = req.model.levels.map((l) => l.id);
  const times = req.observations.times;
  const L = req.segmentLength!;
  const byLevel = ids.map((_, level) => all.filter((p) => p.level === level));
  const silent = ids.filter((_, level) => byLevel[level]!.length === 0);
  if (silent.length) {
    throw new ModelValidationError([
      {
        pointer: '/segmentLength',
        message:
          `each segment fits every level's start from its surveys, and ${silent.join(', ')} ` +
          'has none; fit the whole span instead',
      },
    ]);
  }
  const rowsOf = new Map<number, number[]>(); // segment index → point indices, in row order
  all.forEach((p, i) => {
    const s = Math.floor((p.time - times[0]!) / L);
    if (!rowsOf.has(s)) rowsOf.set(s, []);
    rowsOf.get(s)!.push(i);
  });
  const windows: FitWindow[] = [];
  const used: number[] = [];
  for (const s of [...rowsOf.keys()].sort((a, b) => a - b)) {
    const inside = rowsOf.get(s)!;
    const startRow = all[inside[0]!]!.row;
    // A segment with one surveyed row only fits its own start: nothing to learn from it.
    if (!inside.some((i) => all[i]!.row > startRow)) continue;
    const t0 = times[startRow]!;
    const observed = ids.map((_, level) =>
      inside.some((i) => all[i]!.row === startRow && all[i]!.level === level),
    );
    const guess = Float64Array.from(ids, (_, level) => logInterpolate(byLevel[level]!, t0));
    const base = used.length;
    used.push(...inside);
    windows.push({
      t0,
      t1: all[inside.at(-1)!]!.time,
      guess,
      observedAtStart: observed,
      points: inside.map((_, k) => base + k),
    });
  }
  if (!windows.length) {
    throw new ModelValidationError([
      {
        pointer: '/segmentLength',
        message: 'no segment holds two surveyed times; use longer segments',
      },
    ]);
  }
  return { points: used.map((i) => all[i]!), windows };
}

/** The level's value at `t` from its surveys, log-linearly between the nearest two. */
function logInterpolate(series: readonly FitPoint[], t: number): number {
  let before: FitPoint | undefined;
  let after: FitPoint | undefined;
  for (const p of series) {
    if (p.time <= t) before = p;
    else if (!after) after = p;
  }
  if (before && before.time === t) return before.observed;
  if (!before) return after!.observed;
  if (!after) return before.observed;
  const f = (t - before.time) / (after.time - before.time);
  return Math.exp(before.logObserved + f * (after.logObserved - before.logObserved));
}

/**
 * Integrates one model over the windows of a layout, many times: the fit calls it hundreds of
 * times per parameter vector (and once per window for a segment's start), so it keeps the
 * specialised kernel (the engine's fastest path) and one DOP853 instance.
 */
export class WindowPredictor {
  private readonly kernel: ChainKernel;
  private readonly solver: Dop853;
  private readonly settings: Dop853Options;
  private readonly state: Float64Array;
  private readonly end: Float64Array;

  constructor(
    model: ChainModel,
    private readonly layout: FitLayout,
  ) {
    this.kernel = specialiseChain(model);
    this.solver = new Dop853(this.kernel.dimension);
    this.settings = {
      relativeTolerance: 1e-9,
      absoluteTolerance: 1e-9 * Math.min(...levelScales(model)),
      maxSteps: 200_000,
      attempt: this.kernel.attempt,
    };
    this.state = new Float64Array(this.kernel.dimension);
    this.end = new Float64Array(this.kernel.dimension);
  }

  /**
   * Writes the predicted value of each point of window `w` (started from `y0`) into `out`;
   * NaN where the integration could not reach it (a large miss for the fit).
   */
  window(w: number, y0: Float64Array, out: Float64Array): void {
    const { points } = this.layout;
    const win = this.layout.windows[w]!;
    const order = [...win.points].sort((a, b) => points[a]!.time - points[b]!.time);
    for (const i of order) out[i] = Number.NaN;
    let k = 0;
    while (k < order.length && points[order[k]!]!.time <= win.t0) {
      out[order[k]!] = y0[points[order[k]!]!.level]!;
      k++;
    }
    if (win.t1 <= win.t0) return;
    const { state } = this;
    this.solver.integrate(this.kernel.rhs, win.t0, y0, win.t1, this.end, this.settings, (step) => {
      while (k < order.length && points[order[k]!]!.time <= step.tNew) {
        const p = points[order[k]!]!;
        step.dense(p.time, state);
        out[order[k]!] = state[p.level]!;
        k++;
      }
      for (let i = 0; i < state.length; i++) if (!Number.isFinite(step.yNew[i]!)) return false;
      return true;
    });
  }

  /** The state at `t1` from `y0` at `t0`, or undefined when the integration fails. */
  advance(y0: Float64Array, t0: number, t1: number): Float64Array | undefined {
    const out = new Float64Array(this.kernel.dimension);
    if (t1 <= t0) return Float64Array.from(y0);
    const done = this.solver.integrate(this.kernel.rhs, t0, y0, t1, out, this.settings);
    return done.outcome === 'completed' && out.every((v) => Number.isFinite(v) && v > 0)
      ? out
      : undefined;
  }

  /** Every window, window `w` from `starts[w]`. */
  all(starts: readonly Float64Array[], out: Float64Array): void {
    this.layout.windows.forEach((_, w) => this.window(w, starts[w]!, out));
  }

  /** Dense trajectory of each window for the result's chart: `samples` points per window. */
  trajectories(starts: readonly Float64Array[], samples: number): WindowTrajectory[] {
    const n = this.kernel.dimension;
    const ids = this.kernel.ids;
    return this.layout.windows.map((win, w) => {
      const y0 = starts[w]!;
      const times = Array.from(
        { length: samples },
        (_, i) => win.t0 + ((win.t1 - win.t0) * i) / (samples - 1),
      );
      const series: Record<string, number[]> = {};
      ids.forEach((id, i) => (series[id] = [y0[i]!]));
      let k = 1;
      if (win.t1 > win.t0) {
        this.solver.integrate(
          this.kernel.rhs,
          win.t0,
          y0,
          win.t1,
          new Float64Array(n),
          this.settings,
          (step) => {
            while (k < samples && times[k]! <= step.tNew) {
              step.dense(times[k]!, this.state);
              ids.forEach((id, i) => series[id]!.push(this.state[i]!));
              k++;
            }
          },
        );
      }
      return { start: win.t0, end: win.t1, times: times.slice(0, series[ids[0]!]!.length), series };
    });
  }
}

/** One window's fitted trajectory. */
export interface WindowTrajectory {
  readonly start: number;
  readonly end: number;
  readonly times: number[];
  readonly series: Record<string, number[]>;
}
