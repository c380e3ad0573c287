import type { Derivative } from 'odex';

/** Anything with a dimension and an allocation-free RHS over Float64Array. */
export interface OdeKernel {
  /** State dimension. */
  readonly dimension: number;
  /** Writes dy/dt at (t, y) into `dydt`. */
  rhs(t: number, y: Float64Array, dydt: Float64Array): void;
}

/** An odex derivative over a Float64Array kernel, with its evaluation counter. */
export interface OdexDerivative {
  /** The callback to hand to `Solver.solve`. */
  readonly f: Derivative;
  /** RHS evaluations so far. */
  readonly evaluations: () => number;
}

/**
 * Adapts a Float64Array kernel to odex's `(x, number[]) => number[]`. ODEX copies the returned
 * array into its own storage at once, so one output array and two Float64Array buffers are
 * reused for every call: no allocation per evaluation on our side. `onEvery` (if given) runs
 * every `every` evaluations, e.g. to check a wall-time budget; it may throw to stop.
 */
export function odexDerivative(
  kernel: OdeKernel,
  onEvery?: () => void,
  every = 1024,
): OdexDerivative {
  const n = kernel.dimension;
  const y = new Float64Array(n);
  const dy = new Float64Array(n);
  const out: number[] = new Array<number>(n).fill(0);
  let count = 0;
  const f: Derivative = (t, yy) => {
    for (let i = 0; i < n; i++) y[i] = yy[i]!;
    kernel.rhs(t, y, dy);
    for (let i = 0; i < n; i++) out[i] = dy[i]!;
    if (++count % every === 0 && onEvery) onEvery();
    return out;
  };
  return { f, evaluations: () => count };
}
