import type { ChainKernel } from '../model/chain-kernel';
import { newtonRoot } from '../equilibria/newton-equilibria';
import { eigenvalues } from '../stability/eigenvalues';

/**
 * Factor by which every level's distance from the equilibrium at the window's end must be
 * smaller than its spread over the window: the orbit has visibly contracted onto it.
 */
export const CONTRACTION = 0.1;

/**
 * Whether a window that has not settled ends on a damped approach to an attracting equilibrium:
 * damped Newton from the end state converges to a feasible equilibrium whose Jacobian
 * eigenvalues all have negative real parts (so it attracts every nearby state: Lyapunov's
 * indirect method, common practice), and every level ends within {@link CONTRACTION} × its
 * window spread (max − min) of it. A damped oscillation whose maxima still shrink by more than
 * the cycle test's tolerance is then an equilibrium, not a cycle or chaos; an orbit on a cycle
 * or a chaotic attractor stays a spread away from every equilibrium, and an unstable one fails
 * the eigenvalue test. Newton's residual is scaled by each level's window maximum (its
 * magnitude along the orbit; a level at 0 has collapsed before this is asked).
 */
export function endsOnAttractingEquilibrium(
  kernel: ChainKernel,
  end: ArrayLike<number>,
  min: ArrayLike<number>,
  max: ArrayLike<number>,
): boolean {
  const n = kernel.dimension;
  const y = Float64Array.from(end);
  const scales = Float64Array.from(max, (v) => Math.max(Math.abs(v), Number.MIN_VALUE));
  if (!newtonRoot(kernel, y, scales)) return false;
  for (let i = 0; i < n; i++) {
    if (!(y[i]! >= -1e-12 * scales[i]!)) return false;
    if (!(Math.abs(end[i]! - y[i]!) <= CONTRACTION * (max[i]! - min[i]!))) return false;
  }
  return attracts(kernel, y);
}

/**
 * The attracting equilibrium the chain has without level `lowest` and every level above it,
 * if there is one: damped Newton from `end` with those levels set to 0 (their equations then
 * hold whatever the rest, and Newton's step leaves them at 0, so it solves the shorter chain),
 * feasible (every level ≥ 0), with every eigenvalue of the full Jacobian there of negative real
 * part — the transverse ones are the removed levels' invasion rates, so none of them can grow
 * back from small numbers (common practice in invasion analysis). Undefined when Newton fails,
 * the root is infeasible, or it does not attract.
 */
export function attractingBoundaryWithout(
  kernel: ChainKernel,
  end: ArrayLike<number>,
  max: ArrayLike<number>,
  lowest: number,
): Float64Array | undefined {
  const n = kernel.dimension;
  const y = Float64Array.from(end, (v, i) => (i >= lowest ? 0 : v));
  const scales = Float64Array.from(max, (v) => Math.max(Math.abs(v), Number.MIN_VALUE));
  if (!newtonRoot(kernel, y, scales)) return undefined;
  for (let i = 0; i < n; i++) {
    if (i >= lowest ? y[i] !== 0 : !(y[i]! >= -1e-12 * scales[i]!)) return undefined;
  }
  return attracts(kernel, y) ? y : undefined;
}

/** Whether every eigenvalue of the Jacobian at equilibrium `y` has negative real part. */
function attracts(kernel: ChainKernel, y: Float64Array): boolean {
  const n = kernel.dimension;
  const jac = new Float64Array(n * n);
  kernel.jacobian(0, y, jac);
  return eigenvalues(jac, n).every((e) => e.re < 0);
}
