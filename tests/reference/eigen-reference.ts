import { eigs } from 'mathjs';
import type { Eigenvalue } from '../../shared/stability/eigenvalues';

/** Eigenvalues from mathjs `eigs` (an independent implementation), sorted like ours. */
export function mathjsEigenvalues(matrix: ArrayLike<number>, n: number): Eigenvalue[] {
  const rows = Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) => matrix[i * n + j]!),
  );
  const values = eigs(rows).values as unknown as (number | { re: number; im: number })[];
  return values
    .map((v) => (typeof v === 'number' ? { re: v, im: 0 } : { re: v.re, im: v.im }))
    .sort((p, q) => q.re - p.re || q.im - p.im);
}

/** Bisection for a sign change of f on [lo, hi] to absolute width `tol`. */
export function bisect(f: (x: number) => number, lo: number, hi: number, tol = 1e-12): number {
  let flo = f(lo);
  if (Math.sign(flo) === Math.sign(f(hi))) throw new Error('no sign change');
  while (hi - lo > tol) {
    const mid = (lo + hi) / 2;
    const fm = f(mid);
    if (Math.sign(fm) === Math.sign(flo)) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return (lo + hi) / 2;
}
