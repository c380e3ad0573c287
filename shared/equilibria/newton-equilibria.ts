import type { ChainKernel } from '../model/chain-kernel';

/** Options of the Newton fallback. */
export interface NewtonOptions {
  /** Natural magnitude of each level (start points are spread around it). */
  readonly scales: ArrayLike<number>;
  /** Starts per support (levels 0..p present). Default 48. */
  readonly startsPerSupport?: number;
  /** Whether zero must be kept for levels above the support (false with stocking). */
  readonly supports?: boolean;
}

/** Solves J·dx = −f in place for a small dense system; returns false if singular. */
function solveInPlace(jac: Float64Array, rhs: Float64Array, n: number): boolean {
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++)
      if (Math.abs(jac[r * n + col]!) > Math.abs(jac[piv * n + col]!)) piv = r;
    const p = jac[piv * n + col]!;
    if (!Number.isFinite(p) || Math.abs(p) < 1e-300) return false;
    if (piv !== col) {
      for (let k = 0; k < n; k++) {
        const t = jac[col * n + k]!;
        jac[col * n + k] = jac[piv * n + k]!;
        jac[piv * n + k] = t;
      }
      const t = rhs[col]!;
      rhs[col] = rhs[piv]!;
      rhs[piv] = t;
    }
    for (let r = col + 1; r < n; r++) {
      const f = jac[r * n + col]! / p;
      if (f === 0) continue;
      for (let k = col; k < n; k++) jac[r * n + k]! -= f * jac[col * n + k]!;
      rhs[r]! -= f * rhs[col]!;
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = rhs[r]!;
    for (let k = r + 1; k < n; k++) s -= jac[r * n + k]! * rhs[k]!;
    rhs[r] = s / jac[r * n + r]!;
  }
  return true;
}

function residualNorm(
  kernel: ChainKernel,
  y: Float64Array,
  f: Float64Array,
  scales: ArrayLike<number>,
): number {
  kernel.rhs(0, y, f);
  let s = 0;
  for (let i = 0; i < y.length; i++) s = Math.max(s, Math.abs(f[i]!) / scales[i]!);
  return s;
}

/** Damped Newton on f(y) = 0 from `y` (overwritten). Returns whether it converged. */
export function newtonRoot(
  kernel: ChainKernel,
  y: Float64Array,
  scales: ArrayLike<number>,
): boolean {
  const n = kernel.dimension;
  const f = new Float64Array(n);
  const jac = new Float64Array(n * n);
  const trial = new Float64Array(n);
  const ft = new Float64Array(n);
  let norm = residualNorm(kernel, y, f, scales);
  for (let iter = 0; iter < 100; iter++) {
    if (norm < 1e-13) return true;
    kernel.jacobian(0, y, jac);
    const dx = Float64Array.from(f, (v) => -v);
    if (!solveInPlace(jac, dx, n)) return false;
    let lambda = 1;
    let improved = false;
    for (let k = 0; k < 30; k++, lambda /= 2) {
      for (let i = 0; i < n; i++) trial[i] = y[i]! + lambda * dx[i]!;
      const tn = residualNorm(kernel, trial, ft, scales);
      if (Number.isFinite(tn) && tn < norm) {
        y.set(trial);
        f.set(ft);
        norm = tn;
        improved = true;
        break;
      }
    }
    if (!improved) return norm < 1e-10;
  }
  return norm < 1e-10;
}

/** Deterministic pseudo-random numbers in [0, 1) (a 32-bit LCG; seeds are fixed). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/**
 * Numerical fallback: damped Newton on the full system from deterministic starts spread
 * log-uniformly over [1e-3, 1e3]·scale (a few with negative entries, to catch infeasible roots),
 * with levels above each support starting at zero (with stocking, half of them random instead). Returns every converged root, unsorted and not
 * de-duplicated.
 */
export function newtonEquilibria(kernel: ChainKernel, options: NewtonOptions): Float64Array[] {
  const n = kernel.dimension;
  const rand = lcg(20240601);
  const per = options.startsPerSupport ?? 48;
  const roots: Float64Array[] = [];
  for (let top = -1; top < n; top++) {
    for (let k = 0; k < per; k++) {
      const y = new Float64Array(n);
      for (let i = 0; i <= top; i++) {
        const sign = k % 8 === 7 && rand() < 0.5 ? -1 : 1;
        y[i] = sign * options.scales[i]! * 10 ** (6 * rand() - 3);
      }
      if (options.supports === false && top < n - 1 && k % 2 === 1) {
        for (let i = top + 1; i < n; i++) y[i] = options.scales[i]! * 10 ** (6 * rand() - 3);
      }
      if (!newtonRoot(kernel, y, options.scales)) continue;
      // Roots far outside any plausible range are artefacts of near-singular responses.
      if (y.every((v, i) => Math.abs(v) < 1e6 * options.scales[i]!)) roots.push(y);
    }
  }
  return roots;
}
