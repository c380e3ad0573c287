import { dop853Attempt } from './dop853-step';
import { dop853DenseMonomials, evalDop853Dense, fillDop853Dense } from './dop853-dense';
import {
  validateDop853Options,
  type Dop853Options,
  type Dop853Settings,
  type RhsFunction,
} from './dop853-options';

/** How an `integrate` call ended. */
export type Dop853Outcome = 'completed' | 'stopped' | 'max-steps' | 'step-too-small';

/** Outcome and counters of one `integrate` call. */
export interface Dop853Result {
  readonly outcome: Dop853Outcome;
  /** Time reached (t1 when completed). */
  readonly t: number;
  readonly steps: number;
  readonly accepted: number;
  readonly rejected: number;
  readonly evaluations: number;
  /** Step size the controller proposes next; pass it as `initialStep` to continue cheaply. */
  readonly nextStep: number;
}

/** Called after every accepted step; return `false` to stop the integration there. */
export type Dop853StepCallback = (step: Dop853) => boolean | void;

const SAFE = 0.9;
const FAC_MIN = 1 / 6; // the step grows at most 6-fold ...
const FAC_MAX = 1 / 0.333; // ... and shrinks at most 3-fold (DOP853's fac2 and fac1)
const UROUND = 2.3e-16;

/**
 * Dormand–Prince 8(5,3) with dense output of order 7 (Hairer, Nørsett & Wanner, Solving ODEs I,
 * §II.10; step control as in DOP853). One instance owns every buffer for a fixed dimension, so
 * `integrate` allocates nothing per step; reuse it for many runs. During a step callback,
 * `tOld`/`tNew`, `yOld`/`yNew` and `fOld`/`fNew` describe the accepted step, and `dense*` evaluate
 * the interpolant on [tOld, tNew]; its three extra stages are computed only when first asked for.
 */
export class Dop853 {
  /** Number of components. */
  readonly dimension: number;
  /** Start of the step just accepted. */
  tOld = 0;
  /** End of the step just accepted. */
  tNew = 0;
  private y: Float64Array;
  private yn: Float64Array;
  private readonly yt: Float64Array;
  private readonly k: Float64Array[];
  private readonly f: Float64Array[];
  private denseReady = false;
  private rhs: RhsFunction = () => undefined;
  private evaluations = 0;

  constructor(dimension: number) {
    if (!(Number.isInteger(dimension) && dimension >= 1)) {
      throw new RangeError('dimension must be a positive integer');
    }
    this.dimension = dimension;
    this.y = new Float64Array(dimension);
    this.yn = new Float64Array(dimension);
    this.yt = new Float64Array(dimension);
    this.k = Array.from({ length: 16 }, () => new Float64Array(dimension));
    this.f = Array.from({ length: 7 }, () => new Float64Array(dimension));
  }

  /** State at `tOld` (valid during a step callback). */
  get yOld(): Float64Array {
    return this.y;
  }
  /** State at `tNew` (valid during a step callback). */
  get yNew(): Float64Array {
    return this.yn;
  }
  /** Derivative at `tOld`. */
  get fOld(): Float64Array {
    return this.k[0]!;
  }
  /** Derivative at `tNew`. */
  get fNew(): Float64Array {
    return this.k[12]!;
  }

  /** Interpolated state at t ∈ [tOld, tNew] of the step just accepted, written into `out`. */
  dense(t: number, out: Float64Array): void {
    this.ensureDense();
    const theta = (t - this.tOld) / (this.tNew - this.tOld);
    for (let i = 0; i < this.dimension; i++) out[i] = evalDop853Dense(this.f, this.y, i, theta);
  }

  /** Interpolated component i at t ∈ [tOld, tNew] of the step just accepted. */
  denseComponent(i: number, t: number): number {
    this.ensureDense();
    return evalDop853Dense(this.f, this.y, i, (t - this.tOld) / (this.tNew - this.tOld));
  }

  /**
   * Monomial coefficients (8 entries) of component i's interpolant in
   * θ = (t - tOld)/(tNew - tOld), for exact derivatives of the dense output.
   */
  denseMonomials(i: number, out: Float64Array): void {
    this.ensureDense();
    dop853DenseMonomials(this.f, this.y, i, out);
  }

  private ensureDense(): void {
    if (this.denseReady) return;
    const h = this.tNew - this.tOld;
    const n = this.dimension;
    this.evaluations += fillDop853Dense(
      this.rhs,
      n,
      this.tOld,
      h,
      this.y,
      this.yn,
      this.k,
      this.yt,
      this.f,
    );
    this.denseReady = true;
  }

  /**
   * Integrates from (t0, y0) to t1, writing the final state into `yOut` (which may be `y0`;
   * `y0` is otherwise left untouched). Throws `Dop853OptionError` on bad options before any
   * evaluation.
   */
  integrate(
    rhs: RhsFunction,
    t0: number,
    y0: Float64Array,
    t1: number,
    yOut: Float64Array,
    options: Dop853Options,
    onStep?: Dop853StepCallback,
  ): Dop853Result {
    const n = this.dimension;
    if (y0.length < n || yOut.length < n)
      throw new RangeError('y0 and yOut need dimension entries');
    const s = validateDop853Options(options, n, t0, t1);
    this.rhs = rhs;
    this.evaluations = 0;
    const y0copy = this.y;
    for (let i = 0; i < n; i++) y0copy[i] = y0[i]!;
    const result = this.run(s, t0, t1, onStep);
    yOut.set(this.y.subarray(0, n));
    return result;
  }

  private run(
    s: Dop853Settings,
    t0: number,
    t1: number,
    onStep: Dop853StepCallback | undefined,
  ): Dop853Result {
    const n = this.dimension;
    const k = this.k;
    const rhs = this.rhs;
    const attempt = s.attempt ?? dop853Attempt;
    let t = t0;
    let steps = 0;
    let accepted = 0;
    let rejected = 0;
    if (t1 === t0) return this.result('completed', t, 0, 0, 0, 0);
    const dir = t1 > t0 ? 1 : -1;
    const hmax = Math.min(Math.abs(s.maxStep), Math.abs(t1 - t0));
    rhs(t, this.y, k[0]!);
    this.evaluations++;
    let h = s.initialStep > 0 ? Math.min(s.initialStep, hmax) : this.initialStep(s, t, dir, hmax);
    h *= dir;
    let reject = false;
    let last = false;
    for (;;) {
      if (steps >= s.maxSteps) return this.result('max-steps', t, steps, accepted, rejected, h);
      if (0.1 * Math.abs(h) <= Math.abs(t) * UROUND) {
        return this.result('step-too-small', t, steps, accepted, rejected, h);
      }
      if ((t + 1.01 * h - t1) * dir > 0) {
        h = t1 - t;
        last = true;
      }
      steps++;
      const err = attempt(rhs, n, t, h, this.y, this.yn, this.yt, k, s);
      this.evaluations += 11;
      // err^(1/8) by three square roots: cheaper than Math.pow in the step loop.
      const fac11 = Math.sqrt(Math.sqrt(Math.sqrt(err)));
      if (err <= 1) {
        let hnew = h / Math.max(FAC_MIN, Math.min(FAC_MAX, fac11 / SAFE));
        accepted++;
        const tNew = last ? t1 : t + h;
        rhs(tNew, this.yn, k[12]!);
        this.evaluations++;
        this.tOld = t;
        this.tNew = tNew;
        this.denseReady = false;
        const keepGoing = onStep === undefined || onStep(this) !== false;
        this.swap();
        t = tNew;
        if (last) return this.result('completed', t, steps, accepted, rejected, hnew);
        if (!keepGoing) return this.result('stopped', t, steps, accepted, rejected, hnew);
        if (Math.abs(hnew) > hmax) hnew = dir * hmax;
        if (reject) hnew = dir * Math.min(Math.abs(hnew), Math.abs(h));
        reject = false;
        h = hnew;
      } else {
        // A non-finite error (overflow in a stage) shrinks the step tenfold.
        h = Number.isFinite(err) ? h / Math.min(FAC_MAX, fac11 / SAFE) : h * 0.1;
        reject = true;
        if (accepted >= 1) rejected++;
        last = false;
      }
    }
  }

  /** Hairer's HINIT: a first step from the sizes of y, f and an estimate of f'. */
  private initialStep(s: Dop853Settings, t: number, dir: number, hmax: number): number {
    const n = this.dimension;
    const y = this.y;
    const f0 = this.k[0]!;
    const f1 = this.k[1]!;
    const yt = this.yt;
    let dnf = 0;
    let dny = 0;
    for (let i = 0; i < s.errorComponents; i++) {
      const sk = s.atol + s.rtol * Math.abs(y[i]!);
      dnf += (f0[i]! / sk) ** 2;
      dny += (y[i]! / sk) ** 2;
    }
    let h = dnf <= 1e-10 || dny <= 1e-10 ? 1e-6 : Math.sqrt(dny / dnf) * 0.01;
    h = Math.min(h, hmax);
    for (let i = 0; i < n; i++) yt[i] = y[i]! + dir * h * f0[i]!;
    this.rhs(t + dir * h, yt, f1);
    this.evaluations++;
    let der2 = 0;
    for (let i = 0; i < s.errorComponents; i++) {
      const sk = s.atol + s.rtol * Math.abs(y[i]!);
      der2 += ((f1[i]! - f0[i]!) / sk) ** 2;
    }
    der2 = Math.sqrt(der2) / h;
    const der12 = Math.max(Math.abs(der2), Math.sqrt(dnf));
    const h1 = der12 <= 1e-15 ? Math.max(1e-6, h * 1e-3) : Math.pow(0.01 / der12, 1 / 8);
    return Math.min(100 * h, h1, hmax);
  }

  private swap(): void {
    const y = this.y;
    this.y = this.yn;
    this.yn = y;
    const k0 = this.k[0]!;
    this.k[0] = this.k[12]!;
    this.k[12] = k0;
  }

  private result(
    outcome: Dop853Outcome,
    t: number,
    steps: number,
    accepted: number,
    rejected: number,
    nextStep: number,
  ): Dop853Result {
    const evaluations = this.evaluations;
    return { outcome, t, steps, accepted, rejected, evaluations, nextStep: Math.abs(nextStep) };
  }
}
