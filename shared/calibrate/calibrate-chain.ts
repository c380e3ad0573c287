import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { Matrix } from 'ml-matrix';
import type { ChainModel } from '../model/chain-model';
import { getParameter, withParameter } from '../model/parameter-pointer';
import { assessRegime } from '../regime/assess-regime';
import type { CalibrationRequest } from './calibration-request';
import {
  coordinateErrors,
  goodnessOfFit,
  weightedResiduals,
  type GoodnessOfFit,
} from './fit-statistics';
import { fitLayout, predictPoints, windowTrajectories, type FitLayout } from './fit-windows';
import { startPoints } from './start-points';

/** One fitted value with its approximate standard error. */
export interface Estimate {
  /** `parameter` (a model pointer) or `initial` (a level's starting value). */
  readonly kind: 'parameter' | 'initial';
  /** The model pointer (parameters) or `/initial/<level>` (initial states). */
  readonly pointer: string;
  readonly value: number;
  /** From the Jacobian at the optimum; null when the data cannot tell this value. */
  readonly standardError: number | null;
  readonly min: number;
  readonly max: number;
  /** Whether the estimate sits on its bound (its standard error is then unreliable). */
  readonly atBound: boolean;
}

/** What a calibration returns. */
export interface CalibrationResult {
  readonly estimates: Estimate[];
  /** The model with the fitted parameters. */
  readonly model: ChainModel;
  /** The start with the fitted initial states. */
  readonly initial: Record<string, number>;
  readonly fit: GoodnessOfFit;
  /** Per observation: observed, fitted and the (weighted) log residual. */
  readonly residuals: {
    time: number;
    level: string;
    observed: number;
    fitted: number;
    residual: number;
  }[];
  /** The fitted trajectory, one piece per window (one for a whole-span fit). */
  readonly trajectory: ReturnType<typeof windowTrajectories>;
  /** Every start: where it began and the sum of squares it reached. */
  readonly starts: {
    readonly from: number[];
    readonly sumOfSquares: number;
    readonly iterations: number;
  }[];
  /** The fitted model's long-run regime and largest Lyapunov exponent. */
  readonly regime: { regime: string; lyapunovExponent: number; span: number };
  /** Whether a long-window fit is ill-posed because the fitted model is chaotic on the span. */
  readonly chaotic: boolean;
  /** A segment length to fit with instead (each segment from its own observed start). */
  readonly suggestedSegmentLength?: number;
  readonly zerosSkipped: number;
  readonly warnings: string[];
}

/** Progress (0..1) and cancellation of a calibration. */
export interface CalibrateOptions {
  readonly onProgress?: (fraction: number) => void;
  readonly signal?: AbortSignal;
}

interface Coordinate {
  readonly kind: 'parameter' | 'initial';
  readonly pointer: string;
  readonly min: number;
  readonly max: number;
  readonly logScale: boolean;
  readonly current: number;
}

/** Box [min, max] ↦ [0, 1], logarithmic for positive boxes: rates span orders of magnitude. */
const toUnit = (c: Coordinate, v: number) =>
  c.logScale ? Math.log(v / c.min) / Math.log(c.max / c.min) : (v - c.min) / (c.max - c.min);
const fromUnit = (c: Coordinate, u: number) =>
  c.logScale ? c.min * Math.exp(u * Math.log(c.max / c.min)) : c.min + u * (c.max - c.min);

const ITERATIONS_PER_ROUND = 5;

/**
 * Fits parameters and initial states of a chain to monitoring series by least squares on
 * log-scale residuals (counts and biomasses positive with log-normal error: common practice),
 * with the Levenberg–Marquardt optimiser of ml-levenberg-marquardt (bounds by its box
 * projection), from several deterministic starts. Returns estimates with approximate standard
 * errors, residuals, the fitted trajectory and a chaos warning. Deterministic.
 */
export function calibrateChain(
  req: CalibrationRequest,
  options: CalibrateOptions = {},
): CalibrationResult {
  const layout = fitLayout(req);
  const ids = req.model.levels.map((l) => l.id);
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
  const predicted = new Float64Array(layout.points.length);
  const realise = (values: readonly number[]) => {
    let model = req.model;
    const initial = { ...req.initial };
    coords.forEach((c, j) => {
      if (c.kind === 'parameter') model = withParameter(model, c.pointer, values[j]!);
      else initial[c.pointer.slice('/initial/'.length)] = values[j]!;
    });
    return { model, initial, y0: Float64Array.from(ids, (id) => initial[id]!) };
  };
  const residualsAt = (values: readonly number[]) => {
    const { model, y0 } = realise(values);
    predictPoints(model, y0, layout, predicted);
    return weightedResiduals(layout.points, predicted);
  };

  // The optimiser fits y = f(x) point by point; x is the point's index and f reads the
  // prediction vector computed once per parameter vector.
  const x = layout.points.map((_, i) => i);
  const y = layout.points.map((p) => p.weight * p.logObserved);
  const model = (u: number[]) => {
    if (options.signal?.aborted) throw options.signal.reason ?? new Error('aborted');
    const r = residualsAt(u.map((v, j) => fromUnit(coords[j]!, v)));
    return (i: number) => y[i]! - r[i]!;
  };

  const starts = startPoints(
    coords.map((c) => Math.min(0.98, Math.max(0.02, toUnit(c, c.current)))),
    req.starts,
  );
  const rounds = Math.ceil(req.maxIterations / ITERATIONS_PER_ROUND);
  const tried: CalibrationResult['starts'] = [];
  let best: { u: number[]; ss: number } | undefined;
  starts.forEach((start, s) => {
    let u = start;
    let ss = Number.POSITIVE_INFINITY;
    let iterations = 0;
    for (let round = 0; round < rounds; round++) {
      const fit = levenbergMarquardt({ x, y }, model, {
        initialValues: u,
        minValues: coords.map(() => 0),
        maxValues: coords.map(() => 1),
        gradientDifference: 1e-5,
        maxIterations: ITERATIONS_PER_ROUND,
        errorTolerance: 1e-12,
      });
      iterations += fit.iterations;
      const improved = ss - fit.parameterError;
      u = fit.parameterValues;
      ss = Math.min(ss, fit.parameterError);
      options.onProgress?.((s + (round + 1) / rounds) / (starts.length + 0.2));
      // Stop a start when a round gains less than one part in 10⁹: the optimum is reached.
      if (improved >= 0 && improved <= 1e-9 * Math.max(ss, 1e-12)) break;
    }
    tried.push({
      from: start.map((v, j) => fromUnit(coords[j]!, v)),
      sumOfSquares: ss,
      iterations,
    });
    if (!best || ss < best.ss) best = { u, ss };
  });

  const values = best!.u.map((v, j) => fromUnit(coords[j]!, v));
  const fitted = realise(values);
  const r = residualsAt(values);
  const prediction = Float64Array.from(predicted);
  const weighted = req.observations.standardErrors !== undefined;
  const fit = goodnessOfFit(layout.points, r, prediction, coords.length, weighted);
  const errors = coordinateErrors(
    naturalJacobian(coords, values, residualsAt, r.length),
    fit.sumOfSquares,
    weighted,
  );
  options.onProgress?.((starts.length + 0.1) / (starts.length + 0.2));

  const estimates: Estimate[] = coords.map((c, j) => {
    const e = errors[j] ?? null;
    const u = best!.u[j]!;
    return {
      kind: c.kind,
      pointer: c.pointer,
      value: values[j]!,
      // Natural coordinates are ln v for positive boxes: SE(v) ≈ v·SE(ln v) (delta method).
      standardError: e === null ? null : c.logScale ? values[j]! * e : e,
      min: c.min,
      max: c.max,
      atBound: u <= 1e-6 || u >= 1 - 1e-6,
    };
  });
  const span = req.observations.times.at(-1)! - req.observations.times[0]!;
  const verdict = chaosVerdict(fitted.model, fitted.initial, layout, span, req.segmentLength);
  const warnings = [...verdict.warnings];
  for (const e of estimates) {
    if (e.atBound)
      warnings.push(`${e.pointer} sits on its bound ${e.value}: widen the bounds or fix it`);
    if (e.standardError === null)
      warnings.push(`the data cannot tell ${e.pointer} (no standard error)`);
  }
  if (layout.zerosSkipped) {
    warnings.push(
      `${layout.zerosSkipped} observations of zero have no logarithm and were left out`,
    );
  }
  options.onProgress?.(1);
  return {
    estimates,
    model: fitted.model,
    initial: fitted.initial,
    fit,
    residuals: layout.points.map((p, i) => ({
      time: p.time,
      level: ids[p.level]!,
      observed: p.observed,
      fitted: prediction[i]!,
      residual: r[i]!,
    })),
    trajectory: windowTrajectories(fitted.model, fitted.y0, layout, 101),
    starts: tried,
    regime: verdict.regime,
    chaotic: verdict.chaotic,
    ...(verdict.suggested === undefined ? {} : { suggestedSegmentLength: verdict.suggested }),
    zerosSkipped: layout.zerosSkipped,
    warnings,
  };
}

/** Central-difference Jacobian of the residuals in natural coordinates (ln v or v). */
function naturalJacobian(
  coords: readonly Coordinate[],
  values: readonly number[],
  residualsAt: (v: readonly number[]) => Float64Array,
  n: number,
): Matrix {
  const J = new Matrix(n, coords.length);
  coords.forEach((c, j) => {
    const h = c.logScale ? 1e-4 : 1e-4 * Math.max(Math.abs(values[j]!), (c.max - c.min) * 1e-3);
    const at = (sign: number) => {
      const v = [...values];
      v[j] = c.logScale ? values[j]! * Math.exp(sign * h) : values[j]! + sign * h;
      return residualsAt(v);
    };
    const plus = at(1);
    const minus = at(-1);
    for (let i = 0; i < n; i++) J.set(i, j, (plus[i]! - minus[i]!) / (2 * h));
  });
  return J;
}

/**
 * The fitted model's regime (after a transient of 1000 producer generations, over 2000). When
 * it is chaotic and an error grows e-fold (1/λ) in less than the span of a window, a fit over
 * the whole window matches the data's chaos point by point, which no parameter can do: the
 * least-squares surface is rugged and the optimum meaningless. Segments of about 1/λ fix it.
 */
function chaosVerdict(
  model: ChainModel,
  initial: Record<string, number>,
  layout: FitLayout,
  span: number,
  segmentLength: number | undefined,
) {
  const r = model.levels[0].growthRate;
  const report = assessRegime(model, initial, { transient: 1000 / r, window: 2000 / r });
  const lambda = report.lyapunovExponent.value;
  const longest = Math.max(...layout.windows.map((w) => w.t1 - w.t0));
  const chaotic = report.regime === 'chaotic' && lambda > 0 && longest * lambda > 1;
  const warnings: string[] = [];
  let suggested: number | undefined;
  if (chaotic) {
    suggested = Number((1 / lambda).toPrecision(2));
    warnings.push(
      `the fitted model is chaotic (largest Lyapunov exponent ${lambda.toPrecision(3)} per time ` +
        `unit): errors grow e-fold in ${suggested} time units, less than the ` +
        `${segmentLength === undefined ? 'data span' : 'segments'} (${longest}), so this fit ` +
        `is ill-posed; fit segments of about ${suggested} time units, each from its own ` +
        'observed start (segmentLength)',
    );
  }
  return {
    regime: { regime: report.regime, lyapunovExponent: lambda, span },
    chaotic,
    suggested,
    warnings,
  };
}
