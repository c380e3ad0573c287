import type { dop853Attempt } from './dop853-step';

/** Right-hand side y' = f(t, y), written into `dydt`; must not keep or resize the buffers. */
export type RhsFunction = (t: number, y: Float64Array, dydt: Float64Array) => void;

/**
 * One step attempt as `dop853Attempt` makes it: the stages into k[1..11] (k[0] = f(t, y) on
 * entry), the new state into `yn`, the scaled error norm returned.
 */
export type Dop853AttemptFunction = typeof dop853Attempt;

/** Step-size control and limits for {@link Dop853}. */
export interface Dop853Options {
  /** Relative tolerance applied to every controlled component (> 0). */
  readonly relativeTolerance: number;
  /** Absolute tolerance applied to every controlled component (>= 0). */
  readonly absoluteTolerance: number;
  /** Most steps (accepted or rejected) one `integrate` call may take; default 1 000 000. */
  readonly maxSteps?: number;
  /** First step size to try; 0 or absent picks one automatically (Hairer's HINIT). */
  readonly initialStep?: number;
  /** Largest step size; default the whole interval. */
  readonly maxStep?: number;
  /**
   * How many leading components enter the error norm; default all. Variational runs pass the
   * state dimension so that tangent vectors, which grow without bound between renormalisations,
   * do not dictate the step size.
   */
  readonly errorComponents?: number;
  /**
   * A step attempt specialised to this right-hand side (`fusedDop853AttemptSource`, built by
   * `specialiseChain`), used instead of the generic one; it must compute exactly what
   * `dop853Attempt` computes with `rhs`. The first step, the last stage and the dense output
   * still call `rhs`.
   */
  readonly attempt?: Dop853AttemptFunction;
}

/** Options after validation, with defaults filled in. */
export interface Dop853Settings {
  readonly rtol: number;
  readonly atol: number;
  readonly maxSteps: number;
  readonly initialStep: number;
  readonly maxStep: number;
  readonly errorComponents: number;
  readonly attempt?: Dop853AttemptFunction;
}

/** Raised before integrating when an option or argument is unusable. */
export class Dop853OptionError extends Error {
  /** The option or argument at fault, e.g. `relativeTolerance`. */
  readonly option: string;
  constructor(option: string, message: string) {
    super(`${option}: ${message}`);
    this.name = 'Dop853OptionError';
    this.option = option;
  }
}

/**
 * Checks the options against the problem and fills in defaults. Throws
 * {@link Dop853OptionError} naming the first bad option; never integrates.
 */
export function validateDop853Options(
  options: Dop853Options,
  dimension: number,
  t0: number,
  t1: number,
): Dop853Settings {
  if (!Number.isFinite(t0)) throw new Dop853OptionError('t0', 'must be finite');
  if (!Number.isFinite(t1)) throw new Dop853OptionError('t1', 'must be finite');
  const rtol = options.relativeTolerance;
  if (!(Number.isFinite(rtol) && rtol > 0 && rtol < 1)) {
    throw new Dop853OptionError('relativeTolerance', 'must be a number in (0, 1)');
  }
  const atol = options.absoluteTolerance;
  if (!(Number.isFinite(atol) && atol >= 0)) {
    throw new Dop853OptionError('absoluteTolerance', 'must be a finite number >= 0');
  }
  const maxSteps = options.maxSteps ?? 1_000_000;
  if (!(Number.isInteger(maxSteps) && maxSteps > 0)) {
    throw new Dop853OptionError('maxSteps', 'must be a positive integer');
  }
  const initialStep = options.initialStep ?? 0;
  if (!(Number.isFinite(initialStep) && initialStep >= 0)) {
    throw new Dop853OptionError('initialStep', 'must be a finite number >= 0');
  }
  const span = Math.abs(t1 - t0);
  const maxStep = options.maxStep ?? span;
  if (!(Number.isFinite(maxStep) && maxStep > 0) && span > 0) {
    throw new Dop853OptionError('maxStep', 'must be a finite number > 0');
  }
  const errorComponents = options.errorComponents ?? dimension;
  if (!(
    Number.isInteger(errorComponents) &&
    errorComponents >= 1 &&
    errorComponents <= dimension
  )) {
    throw new Dop853OptionError('errorComponents', `must be an integer in 1..${dimension}`);
  }
  const attempt = options.attempt;
  if (attempt !== undefined && typeof attempt !== 'function') {
    throw new Dop853OptionError('attempt', 'must be a function');
  }
  return { rtol, atol, maxSteps, initialStep, maxStep, errorComponents, attempt };
}
