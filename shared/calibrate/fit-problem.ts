import { Matrix } from 'ml-matrix';
import type { ChainModel } from '../model/chain-model';
import { getParameter, withParameter } from '../model/parameter-pointer';
import type { CalibrationRequest } from './calibration-request';
import { weightedResiduals } from './fit-statistics';
import { fitLayout, WindowPredictor, type FitLayout } from './fit-windows';

/** How far a segment's fitted start may move from its first guess: a factor of 10 either way. */
export const SEGMENT_START_FACTOR = 10;

/** One value the fit searches: a model parameter, an initial state or a segment's start. */
export interface Coordinate {
  readonly kind: 'parameter' | 'initial' | 'segment';
  /** Model pointer, `/initial/<level>`, or `/segments/<window>/<level>`. */
  readonly pointer: string;
  readonly min: number;
  readonly max: number;
  /** Searched on the log scale (every positive box: rates span orders of magnitude). */
  readonly logScale: boolean;
  /** The value the search starts from. */
  readonly current: number;
  /** Segment starts: the window and the level's index. */
  readonly window?: number;
  readonly level?: number;
}

/** Which scale a Jacobian's columns are taken in. */
export type JacobianScale = 'unit' | 'natural';

/** Box [min, max] ↦ [0, 1], logarithmic for positive boxes. */
export const toUnit = (c: Coordinate, v: number) =>
  c.logScale ? Math.log(v / c.min) / Math.log(c.max / c.min) : (v - c.min) / (c.max - c.min);
export const fromUnit = (c: Coordinate, u: number) =>
  c.logScale ? c.min * Math.exp(u * Math.log(c.max / c.min)) : c.min + u * (c.max - c.min);

/** The natural coordinate of a value: ln v on a log scale, v otherwise (standard errors). */
const toNatural = (c: Coordinate, v: number) => (c.logScale ? Math.log(v) : v);
const fromNatural = (c: Coordinate, x: number) => (c.logScale ? Math.exp(x) : x);

/**
 * A calibration as a least-squares problem: the coordinates (what the request fits, plus one
 * start value per level and segment when the data are cut into segments), the weighted log
 * residuals of a coordinate vector, and their Jacobian. A segment's start moves only its own
 * segment's predictions, so its Jacobian column re-integrates that segment alone: a fit of many
 * segments costs about one integration of the data per level, not per segment.
 */
export class FitProblem {
  readonly layout: FitLayout;
  readonly coords: readonly Coordinate[];
  private readonly ids: readonly string[];
  private readonly predicted: Float64Array;
  private cached?: { key: string; predictor: WindowPredictor };

  constructor(private readonly req: CalibrationRequest) {
    this.layout = fitLayout(req);
    this.ids = req.model.levels.map((l) => l.id);
    this.predicted = new Float64Array(this.layout.points.length);
    const coords: Coordinate[] = [
      ...req.parameters.map((p) => ({
        kind: 'parameter' as const,
        pointer: p.pointer,
        min: p.min,
        max: p.max,
        logScale: p.min > 0,
        current: getParameter(req.model, p.pointer),
      })),
      ...req.initialStates.map((s) => ({
        kind: 'initial' as const,
        pointer: `/initial/${s.level}`,
        min: s.min,
        max: s.max,
        logScale: true,
        current: req.initial[s.level]!,
      })),
    ];
    this.layout.windows.forEach((w, window) => {
      if (!w.guess) return;
      this.ids.forEach((id, level) => {
        const g = w.guess![level]!;
        coords.push({
          kind: 'segment',
          pointer: `/segments/${window}/${id}`,
          min: g / SEGMENT_START_FACTOR,
          max: g * SEGMENT_START_FACTOR,
          logScale: true,
          current: g,
          window,
          level,
        });
      });
    });
    this.coords = coords;
  }

  /** The model, initial state and window starts of a coordinate vector. */
  realise(values: readonly number[]) {
    let model: ChainModel = this.req.model;
    const initial = { ...this.req.initial };
    const y0 = () => Float64Array.from(this.ids, (id) => initial[id]!);
    const starts = this.layout.windows.map((w) => (w.guess ? Float64Array.from(w.guess) : null));
    this.coords.forEach((c, j) => {
      if (c.kind === 'parameter') model = withParameter(model, c.pointer, values[j]!);
      else if (c.kind === 'initial') initial[c.pointer.slice('/initial/'.length)] = values[j]!;
      else starts[c.window!]![c.level!] = values[j]!;
    });
    const whole = y0();
    return { model, initial, starts: starts.map((s) => s ?? whole) };
  }

  /** The predictor of the model a vector names; kept while only segment starts change. */
  predictor(values: readonly number[]): WindowPredictor {
    const key = this.coords.map((c, j) => (c.kind === 'parameter' ? values[j] : '')).join(',');
    if (this.cached?.key !== key) {
      this.cached = {
        key,
        predictor: new WindowPredictor(this.realise(values).model, this.layout),
      };
    }
    return this.cached.predictor;
  }

  /**
   * Weighted log residuals of a vector; its predictions are left in `prediction()`. With
   * `window`, only that window is integrated and only its points' entries are meaningful.
   */
  residuals(values: readonly number[], window?: number): Float64Array {
    const predictor = this.predictor(values);
    const { starts } = this.realise(values);
    if (window === undefined) predictor.all(starts, this.predicted);
    else predictor.window(window, starts[window]!, this.predicted);
    return weightedResiduals(this.layout.points, this.predicted);
  }

  /** The state at `t` of window `w` integrated from its start in `values` (or undefined). */
  carry(values: readonly number[], w: number, t: number): Float64Array | undefined {
    const start = this.realise(values).starts[w]!;
    return this.predictor(values).advance(start, this.layout.windows[w]!.t0, t);
  }

  /** The predictions of the last `residuals` call (a copy). */
  prediction(): Float64Array {
    return Float64Array.from(this.predicted);
  }

  /**
   * Finite-difference Jacobian (n × k) of the residuals at `values` (whose residuals are
   * `base`), in unit-box coordinates (for the optimiser) or natural ones (ln v or v, for the
   * standard errors); central or forward, one-sided at a bound so no step leaves the box.
   * With `columns`, only those coordinates' columns are computed (the others stay zero).
   */
  jacobian(
    values: readonly number[],
    base: Float64Array,
    scale: JacobianScale,
    central: boolean,
    columns?: readonly number[],
  ): Matrix {
    const n = base.length;
    const J = new Matrix(n, this.coords.length);
    const scratch = new Float64Array(n);
    const starts = this.realise(values).starts;
    const predictor = this.predictor(values);
    const to = scale === 'unit' ? toUnit : toNatural;
    const from = scale === 'unit' ? fromUnit : fromNatural;
    this.coords.forEach((c, j) => {
      if (columns && !columns.includes(j)) return;
      const v = values[j]!;
      const h = scale === 'unit' || c.logScale ? STEP[scale] : STEP[scale] * linearSize(c, v);
      const inside = (w: number) => w >= c.min && w <= c.max;
      let up = from(c, to(c, v) + h);
      let down = from(c, to(c, v) - h);
      if (!inside(up)) up = v;
      if (!inside(down)) down = v;
      if (!central) {
        if (up !== v) down = v;
        else up = v;
      }
      const spread = to(c, up) - to(c, down);
      let column: (w: number) => Float64Array;
      if (c.kind === 'segment') {
        // A segment's start moves its own window only: integrate that window alone.
        column = (w) => {
          const y0 = Float64Array.from(starts[c.window!]!);
          y0[c.level!] = w;
          predictor.window(c.window!, y0, scratch);
          return weightedResiduals(this.layout.points, scratch);
        };
      } else {
        column = (w) => {
          const moved = [...values];
          moved[j] = w;
          return this.residuals(moved);
        };
      }
      const plus = up === v ? base : column(up);
      const minus = down === v ? base : column(down);
      const rows = c.kind === 'segment' ? this.layout.windows[c.window!]!.points : undefined;
      if (rows) for (const i of rows) J.set(i, j, (plus[i]! - minus[i]!) / spread);
      else for (let i = 0; i < n; i++) J.set(i, j, (plus[i]! - minus[i]!) / spread);
    });
    return J;
  }
}

/** Difference steps: 1e-5 of the unit box (the optimiser), 1e-4 in ln v or v (the errors). */
const STEP: Record<JacobianScale, number> = { unit: 1e-5, natural: 1e-4 };

/** The size a linear-scale step is taken relative to: the value, or a thousandth of the box. */
const linearSize = (c: Coordinate, v: number) => Math.max(Math.abs(v), 1e-3 * (c.max - c.min));
