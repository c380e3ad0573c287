/** Period of a cycle and how many maxima of the observed level it holds. */
export interface MaximaPeriod {
  /** Period in model time units. */
  readonly period: number;
  /** Maxima per period (1 for a simple cycle, 2 after the first period doubling, …). */
  readonly maximaPerPeriod: number;
}

/**
 * The smallest p ≤ 64 for which the sequence of maxima repeats with lag p (every pair of values
 * p apart equal within `tolerance` relative to the largest maximum), and the mean time of one
 * such repeat: the return map of successive maxima used as a Poincaré section (common
 * practice). Needs at least two full repeats; undefined when the maxima do not recur.
 */
export function periodFromMaxima(
  times: readonly number[],
  values: readonly number[],
  tolerance: number,
): MaximaPeriod | undefined {
  const m = values.length;
  if (m < 3) return undefined;
  let top = 0;
  for (const v of values) top = Math.max(top, Math.abs(v));
  const tol = tolerance * Math.max(top, Number.MIN_VALUE);
  for (let p = 1; p <= 64 && 2 * p < m; p++) {
    let repeats = true;
    for (let i = 0; i + p < m && repeats; i++) {
      if (Math.abs(values[i + p]! - values[i]!) > tol) repeats = false;
    }
    if (!repeats) continue;
    const cycles = Math.floor((m - 1) / p);
    const first = m - 1 - cycles * p;
    return { period: (times[m - 1]! - times[first]!) / cycles, maximaPerPeriod: p };
  }
  return undefined;
}

/**
 * {@link periodFromMaxima} over every maximum of the window, else over its later half: an
 * orbit that reaches its cycle inside the window (after a long, possibly chaotic, transient —
 * the Hastings & Powell chain at b1 = 2.6 wanders for thousands of time units before settling
 * on a period-2 cycle) recurs from there on.
 */
export function periodFromLateMaxima(
  times: readonly number[],
  values: readonly number[],
  tolerance: number,
): MaximaPeriod | undefined {
  const half = Math.floor(values.length / 2);
  return (
    periodFromMaxima(times, values, tolerance) ??
    periodFromMaxima(times.slice(half), values.slice(half), tolerance)
  );
}
