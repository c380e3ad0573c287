import { EigenvalueDecomposition } from 'ml-matrix';

/** One eigenvalue of a real matrix. */
export interface Eigenvalue {
  /** Real part. */
  readonly re: number;
  /** Imaginary part. */
  readonly im: number;
}

/**
 * Eigenvalues of a row-major n×n real matrix via ml-matrix's EigenvalueDecomposition (the
 * JAMA/EISPACK Hessenberg–QR algorithm), sorted by real part descending, then by imaginary part
 * descending. Never mutates `matrix`.
 */
export function eigenvalues(matrix: ArrayLike<number>, n: number): Eigenvalue[] {
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(Array.from({ length: n }, (_, j) => matrix[i * n + j]!));
  const evd = new EigenvalueDecomposition(rows, { assumeSymmetric: false });
  const out = evd.realEigenvalues.map((re, k) => ({ re, im: evd.imaginaryEigenvalues[k]! }));
  return out.sort((p, q) => q.re - p.re || q.im - p.im);
}
