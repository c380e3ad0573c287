import type { ChainModel } from '../model/chain-model';
import { assessRegime } from '../regime/assess-regime';
import type { CalibrationRequest } from './calibration-request';
import { FitProblem, fromUnit, SEGMENT_START_FACTOR, toUnit, type Coordinate } from './fit-problem';
import { FitDescent, segmentFirstStarts, type Descent } from './fit-descent';
import { coordinateErrors, goodnessOfFit, type GoodnessOfFit } from './fit-statistics';
import type { FitLayout, WindowTrajectory } from './fit-windows';
import { startPoints } from './start-points';

/** Rounds of a segmented fit (starts alone, then everything): see `calibrateChain`. */
export const SEGMENT_PASSES = 2;

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

/** A segment's fitted start state (segmented fits only). */
export interface SegmentStart {
  readonly start: number;
  readonly end: number;
  /** The fitted state at `start`, per level. */
  readonly state: Record<string, number>;
  readonly standardErrors: Record<string, number | null>;
  /** Levels surveyed at the start row (the others began from interpolated surveys). */
  readonly surveyed: string[];
  /** Whether some level's start sits on its bound (a factor of 10 from the surveys). */
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
  readonly trajectory: WindowTrajectory[];
  /** Segmented fits: each segment's fitted start. */
  readonly segments?: SegmentStart[];
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
  /** A segment length to fit with instead (each segment from its own fitted start). */
  readonly suggestedSegmentLength?: number;
  readonly zerosSkipped: number;
  readonly warnings: string[];
}

/** Progress (0..1) and cancellation of a calibration. */
export interface CalibrateOptions {
  readonly onProgress?: (fraction: number) => void;
  readonly signal?: AbortSignal;
}

/**
 * Fits parameters and initial states of a chain to monitoring series by least squares on
 * log-scale residuals (counts and biomasses positive with log-normal error: common practice),
 * with the Levenberg–Marquardt optimiser of ml-levenberg-marquardt (bounds by its box
 * projection), from several deterministic starts. Returns estimates with approximate standard
 * errors, residuals, the fitted trajectory and a chaos warning. Deterministic.
 *
 * With `segmentLength` each segment is integrated from a start state that is fitted too (one
 * nuisance value per level and segment, on the log scale, within a factor of 10 of the surveys
 * at the segment's first row): the idea of multiple shooting (Bock 1981; Voss, Timmer & Kurths
 * 2004, "Nonlinear dynamical system identification from uncertain and indirect measurements",
 * both recalled from memory), without its continuity constraints between segments. Starting
 * each segment from the surveyed values instead would treat noisy, sometimes missing counts as
 * the exact state, which biases the estimates; here the start row's counts are data like any
 * other, and the parameters' standard errors include the uncertainty of every start.
 */
export function calibrateChain(
  req: CalibrationRequest,
  options: CalibrateOptions = {},
): CalibrationResult {
  const problem = new FitProblem(req);
  const { layout, coords } = problem;
  const ids = req.model.levels.map((l) => l.id);
  const checkAbort = () => {
    if (options.signal?.aborted) throw options.signal.reason ?? new Error('aborted');
  };
  const descent = new FitDescent(problem, checkAbort);
  const fitted = coords.filter((c) => c.kind !== 'segment').length;
  // Requested values start spread over their boxes; segment starts at the surveys, always.
  const spread = startPoints(
    coords.slice(0, fitted).map((c) => Math.min(0.98, Math.max(0.02, toUnit(c, c.current)))),
    req.starts,
  );
  const starts = spread.map((s) => [
    ...s,
    ...coords.slice(fitted).map((c) => toUnit(c, c.current)),
  ]);
  const tried: CalibrationResult['starts'] = [];
  let best: Descent | undefined;
  const passes = layout.segmented ? SEGMENT_PASSES : 1;
  starts.forEach((start, s) => {
    let u = start;
    let found: Descent | undefined;
    let iterations = 0;
    for (let pass = 0; pass < passes; pass++) {
      // Of each segmented pass, the starts alone count for a third of the work.
      const report = (f: number) =>
        options.onProgress?.((s + (pass + f) / passes) / (starts.length + 0.2));
      const share = layout.segmented ? 1 / 3 : 0;
      // Segmented: the starts alone first, then everything; the second pass begins its starts
      // from parameters near the optimum, where the carried states are close to the truth.
      if (layout.segmented) {
        u = segmentFirstStarts(problem, u, req.maxIterations, checkAbort, (w, of) =>
          report((share * w) / of),
        );
      }
      found = descent.descend(u, req.maxIterations, (k) =>
        report(share + ((1 - share) * k) / req.maxIterations),
      );
      u = found.u;
      iterations += found.iterations;
    }
    tried.push({
      from: start.slice(0, fitted).map((v, j) => fromUnit(coords[j]!, v)),
      sumOfSquares: found!.ss,
      iterations,
    });
    if (!best || found!.ss < best.ss) best = found;
  });

  const values = best!.u.map((v, j) => fromUnit(coords[j]!, v));
  const realised = problem.realise(values);
  const r = problem.residuals(values);
  const prediction = problem.prediction();
  const weighted = req.observations.standardErrors !== undefined;
  const fit = goodnessOfFit(layout.points, r, prediction, coords.length, weighted);
  const errors = coordinateErrors(
    problem.jacobian(values, r, 'natural', true),
    fit.sumOfSquares,
    weighted,
  );
  options.onProgress?.((starts.length + 0.1) / (starts.length + 0.2));

  const all = coords.map((c, j) => {
    const e = errors[j] ?? null;
    const u = best!.u[j]!;
    return {
      value: values[j]!,
      // Natural coordinates are ln v for positive boxes: SE(v) ≈ v·SE(ln v) (delta method).
      standardError: e === null ? null : c.logScale ? values[j]! * e : e,
      atBound: u <= 1e-6 || u >= 1 - 1e-6,
    };
  });
  const estimates: Estimate[] = coords.slice(0, fitted).map((c, j) => ({
    kind: c.kind as Estimate['kind'],
    pointer: c.pointer,
    ...all[j]!,
    min: c.min,
    max: c.max,
  }));
  const segments = layout.segmented ? segmentStarts(layout, ids, coords, all, fitted) : undefined;
  const span = req.observations.times.at(-1)! - req.observations.times[0]!;
  const verdict = chaosVerdict(realised.model, realised.initial, layout, span, req.segmentLength);
  const warnings = [...verdict.warnings];
  for (const e of estimates) {
    if (e.atBound)
      warnings.push(`${e.pointer} sits on its bound ${e.value}: widen the bounds or fix it`);
    if (e.standardError === null)
      warnings.push(`the data cannot tell ${e.pointer} (no standard error)`);
  }
  const pinned = segments?.filter((s) => s.atBound).map((s) => s.start) ?? [];
  if (pinned.length) {
    warnings.push(
      `the fitted start of the segments at t = ${pinned.join(', ')} sits a factor of ` +
        `${SEGMENT_START_FACTOR} from the surveys there: check those surveys, or use shorter segments`,
    );
  }
  if (layout.zerosSkipped) {
    warnings.push(
      `${layout.zerosSkipped} observations of zero have no logarithm and were left out`,
    );
  }
  options.onProgress?.(1);
  return {
    estimates,
    model: realised.model,
    initial: realised.initial,
    fit,
    residuals: layout.points.map((p, i) => ({
      time: p.time,
      level: ids[p.level]!,
      observed: p.observed,
      fitted: prediction[i]!,
      residual: r[i]!,
    })),
    trajectory: problem.predictor(values).trajectories(realised.starts, 101),
    ...(segments ? { segments } : {}),
    starts: tried,
    regime: verdict.regime,
    chaotic: verdict.chaotic,
    ...(verdict.suggested === undefined ? {} : { suggestedSegmentLength: verdict.suggested }),
    zerosSkipped: layout.zerosSkipped,
    warnings,
  };
}

/** Each segment's fitted start, with its standard errors, from the segment coordinates. */
function segmentStarts(
  layout: FitLayout,
  ids: readonly string[],
  coords: readonly Coordinate[],
  all: readonly { value: number; standardError: number | null; atBound: boolean }[],
  offset: number,
): SegmentStart[] {
  return layout.windows.map((w, window) => {
    const state: Record<string, number> = {};
    const standardErrors: Record<string, number | null> = {};
    let atBound = false;
    coords.forEach((c, j) => {
      if (j < offset || c.window !== window) return;
      const id = ids[c.level!]!;
      state[id] = all[j]!.value;
      standardErrors[id] = all[j]!.standardError;
      atBound ||= all[j]!.atBound;
    });
    const surveyed = ids.filter((_, level) => w.observedAtStart?.[level]);
    return { start: w.t0, end: w.t1, state, standardErrors, surveyed, atBound };
  });
}

/**
 * The fitted model's regime (after a transient of 1000 producer generations, over 2000). When
 * it is chaotic and an error grows e-fold (1/λ) in less than the span of a window, a fit over
 * the whole window matches the data's chaos point by point, which no parameter can do: the
 * least-squares surface is rugged and the optimum meaningless. Shorter segments fix it; the
 * suggestion is a quarter of 1/λ, because even below the Lyapunov time a segment spanning many
 * fast cycles has several minima in its start state: on the invented lake (1/λ ≈ 100 weeks,
 * surveys every 2 weeks, 10 % noise) segments of 30 and 50 weeks recovered the truth, and
 * segments of 100 weeks stalled in 2 of 5 seeded datasets (our own trials).
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
    const efold = Number((1 / lambda).toPrecision(2));
    suggested = Number((0.25 / lambda).toPrecision(2));
    warnings.push(
      `the fitted model is chaotic (largest Lyapunov exponent ${lambda.toPrecision(3)} per time ` +
        `unit): errors grow e-fold in ${efold} time units, less than the ` +
        `${segmentLength === undefined ? 'data span' : 'segments'} (${longest}), so this fit ` +
        `is ill-posed; fit segments of about ${suggested} time units, each from its own ` +
        'fitted start (segmentLength)',
    );
  }
  return {
    regime: { regime: report.regime, lyapunovExponent: lambda, span },
    chaotic,
    suggested,
    warnings,
  };
}
