/** Options of {@link lyapunovSpectrum}; times are in model time units. */
export interface LyapunovOptions {
  /** Time integrated first and discarded, so the orbit reaches its attractor (>= 0). */
  readonly transient: number;
  /** Time over which the exponents are averaged (> 0). */
  readonly window: number;
  /** How many exponents, largest first: 1 (default) up to the dimension (full spectrum). */
  readonly exponents?: number;
  /** Sub-windows for the batch-means standard error; default 20. */
  readonly batches?: number;
  /** Renormalisations per batch; default 50. */
  readonly renormalisations?: number;
  /** Relative tolerance of the integrator; default 1e-8. */
  readonly relativeTolerance?: number;
  /** Absolute tolerance; default equal to the relative one. */
  readonly absoluteTolerance?: number;
  /** Most integrator steps over transient and window; default 5 000 000. */
  readonly maxSteps?: number;
  /** Index of the level whose local maxima are recorded (for the period); default the top. */
  readonly observe?: number;
}

/** Options after checks, defaults filled in. */
export type LyapunovSettings = Required<LyapunovOptions>;

/** Raised before any integration when a Lyapunov option is unusable. */
export class LyapunovOptionError extends Error {
  /** The option at fault. */
  readonly option: string;
  constructor(option: string, message: string) {
    super(`${option}: ${message}`);
    this.name = 'LyapunovOptionError';
    this.option = option;
  }
}

const positiveInt = (v: number, min: number, max: number) =>
  Number.isInteger(v) && v >= min && v <= max;

/** Checks options against a system of dimension n; throws {@link LyapunovOptionError}. */
export function validateLyapunovOptions(o: LyapunovOptions, n: number): LyapunovSettings {
  if (!(Number.isFinite(o.transient) && o.transient >= 0)) {
    throw new LyapunovOptionError('transient', 'must be a finite number >= 0');
  }
  if (!(Number.isFinite(o.window) && o.window > 0)) {
    throw new LyapunovOptionError('window', 'must be a finite number > 0');
  }
  const exponents = o.exponents ?? 1;
  if (!positiveInt(exponents, 1, n)) {
    throw new LyapunovOptionError('exponents', `must be an integer in 1..${n}`);
  }
  const batches = o.batches ?? 20;
  if (!positiveInt(batches, 2, 1000)) {
    throw new LyapunovOptionError('batches', 'must be an integer in 2..1000');
  }
  const renormalisations = o.renormalisations ?? 50;
  if (!positiveInt(renormalisations, 1, 100_000)) {
    throw new LyapunovOptionError('renormalisations', 'must be an integer in 1..100000');
  }
  const relativeTolerance = o.relativeTolerance ?? 1e-8;
  if (!(relativeTolerance >= 1e-14 && relativeTolerance <= 1e-2)) {
    throw new LyapunovOptionError('relativeTolerance', 'must be in [1e-14, 1e-2]');
  }
  const absoluteTolerance = o.absoluteTolerance ?? relativeTolerance;
  if (!(Number.isFinite(absoluteTolerance) && absoluteTolerance >= 0)) {
    throw new LyapunovOptionError('absoluteTolerance', 'must be a finite number >= 0');
  }
  const maxSteps = o.maxSteps ?? 5_000_000;
  if (!positiveInt(maxSteps, 1, 1e9)) {
    throw new LyapunovOptionError('maxSteps', 'must be a positive integer');
  }
  const observe = o.observe ?? n - 1;
  if (!positiveInt(observe, 0, n - 1)) {
    throw new LyapunovOptionError('observe', `must be an integer in 0..${n - 1}`);
  }
  return {
    transient: o.transient,
    window: o.window,
    exponents,
    batches,
    renormalisations,
    relativeTolerance,
    absoluteTolerance,
    maxSteps,
    observe,
  };
}
