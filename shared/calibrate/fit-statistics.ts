import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { FitPoint } from './fit-windows';

/** Goodness of fit on the log scale, where the observation error is assumed normal. */
export interface GoodnessOfFit {
  /** Observations used. */
  readonly points: number;
  /** Values fitted. */
  readonly fitted: number;
  /** Σ (w·(ln y − ln ŷ))². */
  readonly sumOfSquares: number;
  /** √(Σ (ln y − ln ŷ)² / n), unweighted: the typical log-scale miss (0.1 ≈ 10 %). */
  readonly rmse: number;
  /**
   * Weighted fits only: √(Σ r² / n) of the residuals in units of the data's own standard
   * errors; near 1 when the stated errors are right (a little below: the fit used k values).
   */
  readonly weightedRms?: number;
  /** 1 − SS_res/SS_tot of the log values (unweighted, about each level's mean). */
  readonly rSquaredLog: number;
  /** Akaike's criterion for Gaussian errors, n·ln(SS/n) + 2k, to compare fits of one dataset. */
  readonly aic: number;
  /** Whether the per-row standard errors of the data weighted the fit. */
  readonly weighted: boolean;
}

/** Weighted log residuals w·(ln y − ln ŷ); a missing prediction counts as a large miss. */
export function weightedResiduals(
  points: readonly FitPoint[],
  predicted: Float64Array,
): Float64Array {
  const r = new Float64Array(points.length);
  points.forEach((p, i) => {
    const y = predicted[i]!;
    // A level the model drives to zero (or a failed integration) is a miss of e^20 at most.
    const logY =
      Number.isFinite(y) && y > 0 ? Math.max(Math.log(y), p.logObserved - 20) : p.logObserved - 20;
    r[i] = p.weight * (p.logObserved - logY);
  });
  return r;
}

/** The goodness-of-fit figures of residuals `r` (weighted) with `k` values fitted. */
export function goodnessOfFit(
  points: readonly FitPoint[],
  r: Float64Array,
  predicted: Float64Array,
  k: number,
  weighted: boolean,
): GoodnessOfFit {
  const n = points.length;
  let ss = 0;
  for (const v of r) ss += v * v;
  const means = new Map<number, { sum: number; count: number }>();
  for (const p of points) {
    const m = means.get(p.level) ?? { sum: 0, count: 0 };
    m.sum += p.logObserved;
    m.count++;
    means.set(p.level, m);
  }
  let ssRes = 0;
  let ssTot = 0;
  points.forEach((p, i) => {
    const m = means.get(p.level)!;
    const y = predicted[i]!;
    const miss = p.logObserved - (y > 0 ? Math.log(y) : p.logObserved - 20);
    ssRes += miss * miss;
    ssTot += (p.logObserved - m.sum / m.count) ** 2;
  });
  return {
    points: n,
    fitted: k,
    sumOfSquares: ss,
    rmse: Math.sqrt(ssRes / Math.max(1, n)),
    ...(weighted ? { weightedRms: Math.sqrt(ss / Math.max(1, n)) } : {}),
    rSquaredLog: ssTot > 0 ? 1 - ssRes / ssTot : 0,
    aic: n * Math.log(Math.max(ss, 1e-300) / n) + 2 * k,
    weighted,
  };
}

/**
 * Approximate standard errors of the fitted coordinates from the Jacobian `J` (n × k, of the
 * weighted residuals) at the optimum: Cov = s²·(JᵀJ)⁻¹, the Gauss–Newton approximation of
 * the inverse Hessian (Bates & Watts, Nonlinear Regression Analysis, 1988, ch. 2, recalled from
 * memory). Without given standard errors s² = SS/(n − k) estimates the noise; with them s² = 1.
 * A direction the data cannot tell (a near-zero eigenvalue of JᵀJ) gives null.
 */
export function coordinateErrors(
  jacobian: Matrix,
  sumOfSquares: number,
  weighted: boolean,
): (number | null)[] {
  const n = jacobian.rows;
  const k = jacobian.columns;
  const jtj = jacobian.transpose().mmul(jacobian);
  const eig = new EigenvalueDecomposition(jtj, { assumeSymmetric: true });
  const values = eig.realEigenvalues;
  const largest = Math.max(...values.map(Math.abs));
  if (!(largest > 0)) return Array.from({ length: k }, () => null);
  const s2 = weighted ? 1 : sumOfSquares / Math.max(1, n - k);
  const vectors = eig.eigenvectorMatrix;
  const out: (number | null)[] = [];
  for (let j = 0; j < k; j++) {
    let variance = 0;
    let unidentified = false;
    values.forEach((lambda, m) => {
      const v = vectors.get(j, m);
      if (Math.abs(lambda) <= 1e-10 * largest) {
        if (Math.abs(v) > 1e-6) unidentified = true;
        return;
      }
      variance += (v * v) / lambda;
    });
    out.push(unidentified ? null : Math.sqrt(s2 * variance));
  }
  return out;
}
