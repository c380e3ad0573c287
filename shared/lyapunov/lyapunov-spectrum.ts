import type { ChainKernel } from '../model/chain-kernel';
import { Dop853, type Dop853Outcome } from '../integrate/dop853';
import type { Dop853Options } from '../integrate/dop853-options';
import { LocalMaxima } from '../regime/local-maxima';
import { validateLyapunovOptions, type LyapunovOptions } from './lyapunov-options';
import { orthonormaliseTangents } from './orthonormalise-tangents';

/** Exponents with batch-means errors plus what the window showed of the orbit. */
export interface LyapunovResult {
  /** How the run ended; anything but `completed` means the figures cover less than the window. */
  readonly outcome: Dop853Outcome | 'not-finite';
  /** The largest `exponents` Lyapunov exponents, descending, per model time unit. */
  readonly exponents: number[];
  /** Standard error of each exponent from the batch means. */
  readonly standardErrors: number[];
  /** Time average of the divergence (trace of the Jacobian) along the window. */
  readonly meanDivergence: number;
  /** State at the end of the window. */
  readonly state: Float64Array;
  /** Smallest value of each level over the window (at step ends). */
  readonly windowMin: number[];
  /** Largest value of each level over the window (at step ends). */
  readonly windowMax: number[];
  /** Times of the local maxima of the observed level over the window. */
  readonly maximaTimes: number[];
  /** Values of those maxima, located from the dense output. */
  readonly maximaValues: number[];
  /** Integrator steps over transient and window. */
  readonly steps: number;
  /** Right-hand-side evaluations (each also computes the Jacobian in the window). */
  readonly evaluations: number;
}

/**
 * Lyapunov exponents by the method of Benettin, Galgani, Giorgilli & Strelcyn (1980, Meccanica
 * 15:9–20): after a transient, the state is integrated with k tangent vectors obeying the
 * variational equation v' = J(y) v (the kernel's analytic Jacobian); every `window /
 * (batches · renormalisations)` time units the vectors are re-orthonormalised by Gram–Schmidt
 * (a QR factorisation) and the logarithms of the diagonal of R are summed per exponent. The
 * standard error comes from batch means over `batches` equal sub-windows (common practice for
 * correlated time averages). The divergence trace J is integrated alongside, so that the sum of
 * the full spectrum can be checked against it (Liouville's formula). `onWindowStep` sees every
 * accepted step of the window (times from 0 at the window's start; the first n components of
 * the step's state are the levels), for evidence the result does not hold (a level's trend).
 */
export function lyapunovSpectrum(
  kernel: ChainKernel,
  y0: Float64Array,
  options: LyapunovOptions,
  onWindowStep?: (step: Dop853) => void,
): LyapunovResult {
  const n = kernel.dimension;
  const o = validateLyapunovOptions(options, n);
  if (y0.length !== n) throw new RangeError(`y0 needs ${n} entries`);
  const k = o.exponents;
  const size = n + n * k + 1;
  const plainRhs = kernel.rhs.bind(kernel);
  const y = Float64Array.from(y0);
  const integration: Dop853Options = {
    relativeTolerance: o.relativeTolerance,
    absoluteTolerance: o.absoluteTolerance,
    maxSteps: o.maxSteps,
  };
  let steps = 0;
  let evaluations = 0;
  let h = 0;
  if (o.transient > 0) {
    const plain = { ...integration, attempt: kernel.attempt };
    const r = new Dop853(n).integrate(plainRhs, 0, y, o.transient, y, plain);
    steps += r.steps;
    evaluations += r.evaluations;
    h = r.nextStep;
    if (r.outcome !== 'completed') return empty(r.outcome, k, y, steps, evaluations);
  }

  const ys = new Float64Array(n);
  const fs = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const rhs = (t: number, Y: Float64Array, D: Float64Array): void => {
    for (let i = 0; i < n; i++) ys[i] = Y[i]!;
    kernel.rhs(t, ys, fs);
    kernel.jacobian(t, ys, jac);
    let trace = 0;
    for (let i = 0; i < n; i++) {
      D[i] = fs[i]!;
      trace += jac[i * n + i]!;
    }
    for (let v = 0; v < k; v++) {
      const off = n + v * n;
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += jac[i * n + j]! * Y[off + j]!;
        D[off + i] = s;
      }
    }
    D[size - 1] = trace;
  };

  const Y = new Float64Array(size);
  Y.set(y);
  // Start vector v: e_v plus a small share of every direction, so that no start lies exactly
  // in an invariant subspace (e.g. a predator-free plane) that would hide the leading exponent.
  for (let v = 0; v < k; v++) {
    for (let i = 0; i < n; i++) Y[n + v * n + i] = (i === v ? 1 : 0) + 0.1 / (1 + i + v);
  }
  const logR = new Float64Array(k);
  orthonormaliseTangents(Y, n, k, logR);

  const minimum = Array.from(y);
  const maximum = Array.from(y);
  const maxima = new LocalMaxima(o.observe);
  const onStep = (step: Dop853): void => {
    const yn = step.yNew;
    for (let i = 0; i < n; i++) {
      const v = yn[i]!;
      if (v < minimum[i]!) minimum[i] = v;
      if (v > maximum[i]!) maximum[i] = v;
    }
    maxima.observe(step);
    onWindowStep?.(step);
  };

  const stepper = new Dop853(size);
  const batchSums = new Float64Array(o.batches * k);
  const tau = o.window / (o.batches * o.renormalisations);
  const errorComponents = n + n * k; // the divergence integral is a by-product, not controlled
  let t = 0;
  let outcome: LyapunovResult['outcome'] = 'completed';
  outer: for (let b = 0; b < o.batches; b++) {
    for (let r = 0; r < o.renormalisations; r++) {
      const t1 = (b * o.renormalisations + r + 1) * tau;
      const res = stepper.integrate(
        rhs,
        t,
        Y,
        t1,
        Y,
        {
          ...integration,
          maxSteps: Math.max(1, o.maxSteps - steps),
          initialStep: h,
          errorComponents,
        },
        onStep,
      );
      steps += res.steps;
      evaluations += res.evaluations;
      h = res.nextStep;
      t = t1;
      if (res.outcome !== 'completed') {
        outcome = res.outcome;
        break outer;
      }
      if (!orthonormaliseTangents(Y, n, k, logR)) {
        outcome = 'not-finite';
        break outer;
      }
      for (let v = 0; v < k; v++) batchSums[b * k + v] = batchSums[b * k + v]! + logR[v]!;
    }
  }
  const batchLength = o.window / o.batches;
  const exponents: number[] = [];
  const standardErrors: number[] = [];
  for (let v = 0; v < k; v++) {
    let mean = 0;
    for (let b = 0; b < o.batches; b++) mean += batchSums[b * k + v]! / batchLength;
    mean /= o.batches;
    let ss = 0;
    for (let b = 0; b < o.batches; b++) ss += (batchSums[b * k + v]! / batchLength - mean) ** 2;
    exponents.push(mean);
    standardErrors.push(Math.sqrt(ss / (o.batches - 1) / o.batches));
  }
  return {
    outcome,
    exponents,
    standardErrors,
    meanDivergence: Y[size - 1]! / o.window,
    state: Y.slice(0, n),
    windowMin: minimum,
    windowMax: maximum,
    maximaTimes: maxima.maximaTimes(),
    maximaValues: maxima.maximaValues(),
    steps,
    evaluations,
  };
}

function empty(
  outcome: Dop853Outcome,
  k: number,
  y: Float64Array,
  steps: number,
  evaluations: number,
): LyapunovResult {
  const nan = Array.from({ length: k }, () => Number.NaN);
  const state = Array.from(y);
  return {
    outcome,
    exponents: nan,
    standardErrors: [...nan],
    meanDivergence: Number.NaN,
    state: y,
    windowMin: state,
    windowMax: [...state],
    maximaTimes: [],
    maximaValues: [],
    steps,
    evaluations,
  };
}
