import { Dop853 } from '../integrate/dop853';
import type { ChainModel } from '../model/chain-model';
import { levelScales } from '../model/chain-kernel';
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
 * A stretch of the data integrated in one go: from `t0` and `start` (the scenario's start at
 * t = 0, or an observed row), predicting `points` (indices into the point list).
 */
export interface FitWindow {
  readonly t0: number;
  readonly t1: number;
  /** Observed start state (segments) or undefined (whole span: the fitted initial state). */
  readonly start?: Float64Array;
  readonly points: readonly number[];
}

/** The points and windows of a calibration, built once. */
export interface FitLayout {
  readonly points: readonly FitPoint[];
  readonly windows: readonly FitWindow[];
  /** Observations of exactly zero, which have no logarithm and are left out of the fit. */
  readonly zerosSkipped: number;
}

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
  const span = times.at(-1)!;
  if (req.segmentLength === undefined) {
    return {
      points,
      windows: [{ t0: 0, t1: span, points: points.map((_, i) => i) }],
      zerosSkipped,
    };
  }
  const windows: FitWindow[] = [];
  const L = req.segmentLength;
  const first = times[0]!;
  for (let cut = first; cut <= span; cut += L) {
    const rows = times.map((t, r) => r).filter((r) => times[r]! >= cut && times[r]! < cut + L);
    const startRow = rows.find((r) => ids.every((id) => (levels[id]?.[r] ?? 0) > 0));
    if (startRow === undefined) continue;
    const inside = points
      .map((p, i) => [p, i] as const)
      .filter(([p]) => p.row > startRow && rows.includes(p.row))
      .map(([, i]) => i);
    if (!inside.length) continue;
    windows.push({
      t0: times[startRow]!,
      t1: times[rows.at(-1)!]!,
      start: Float64Array.from(ids, (id) => levels[id]![startRow]!),
      points: inside,
    });
  }
  if (windows.length) {
    // Only points some window predicts take part (a segment's start row is its initial state).
    const used = windows.flatMap((w) => w.points);
    const index = new Map(used.map((old, i) => [old, i]));
    return {
      points: used.map((i) => points[i]!),
      windows: windows.map((w) => ({ ...w, points: w.points.map((i) => index.get(i)!) })),
      zerosSkipped,
    };
  }
  throw new ModelValidationError([
    {
      pointer: '/segmentLength',
      message:
        'no segment has a row observing every level followed by more data; use longer segments',
    },
  ]);
}

/**
 * Integrates `model` over every window and writes the predicted value of each point into
 * `out` (NaN where the integration could not reach it). DOP853 on the specialised kernel: the
 * fit calls this hundreds of times, so it uses the engine's fastest path.
 */
export function predictPoints(
  model: ChainModel,
  initial: Float64Array,
  layout: FitLayout,
  out: Float64Array,
): void {
  out.fill(Number.NaN);
  const kernel = specialiseChain(model);
  const n = kernel.dimension;
  const solver = new Dop853(n);
  const atol = 1e-9 * Math.min(...levelScales(model));
  const state = new Float64Array(n);
  const end = new Float64Array(n);
  for (const w of layout.windows) {
    const y0 = w.start ?? initial;
    const order = [...w.points].sort((a, b) => layout.points[a]!.time - layout.points[b]!.time);
    let k = 0;
    const take = (t: number, read: (i: number) => number) => {
      while (k < order.length && layout.points[order[k]!]!.time <= t) {
        const p = layout.points[order[k]!]!;
        out[order[k]!] = read(p.level);
        k++;
      }
    };
    take(w.t0, (i) => y0[i]!);
    // Points the integration does not reach (it stopped early) stay NaN: a large miss.
    if (w.t1 <= w.t0) continue;
    solver.integrate(
      kernel.rhs,
      w.t0,
      y0,
      w.t1,
      end,
      { relativeTolerance: 1e-9, absoluteTolerance: atol, maxSteps: 200_000 },
      (step) => {
        while (k < order.length && layout.points[order[k]!]!.time <= step.tNew) {
          const p = layout.points[order[k]!]!;
          step.dense(p.time, state);
          out[order[k]!] = state[p.level]!;
          k++;
        }
        for (let i = 0; i < n; i++) if (!Number.isFinite(step.yNew[i]!)) return false;
        return true;
      },
    );
  }
}

/** Dense trajectory of each window for the result's chart: `samples` points per window. */
export function windowTrajectories(
  model: ChainModel,
  initial: Float64Array,
  layout: FitLayout,
  samples: number,
): { start: number; end: number; times: number[]; series: Record<string, number[]> }[] {
  const kernel = specialiseChain(model);
  const n = kernel.dimension;
  const solver = new Dop853(n);
  const atol = 1e-9 * Math.min(...levelScales(model));
  const state = new Float64Array(n);
  return layout.windows.map((w) => {
    const y0 = w.start ?? initial;
    const times = Array.from(
      { length: samples },
      (_, i) => w.t0 + ((w.t1 - w.t0) * i) / (samples - 1),
    );
    const series: Record<string, number[]> = {};
    kernel.ids.forEach((id, i) => (series[id] = [y0[i]!]));
    let k = 1;
    if (w.t1 > w.t0) {
      solver.integrate(
        kernel.rhs,
        w.t0,
        y0,
        w.t1,
        new Float64Array(n),
        { relativeTolerance: 1e-9, absoluteTolerance: atol, maxSteps: 200_000 },
        (step) => {
          while (k < samples && times[k]! <= step.tNew) {
            step.dense(times[k]!, state);
            kernel.ids.forEach((id, i) => series[id]!.push(state[i]!));
            k++;
          }
        },
      );
    }
    return {
      start: w.t0,
      end: w.t1,
      times: times.slice(0, series[kernel.ids[0]!]!.length),
      series,
    };
  });
}
