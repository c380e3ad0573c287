import type { Dop853 } from '../integrate/dop853';

/**
 * Time at which component i first falls to `threshold` inside the step just accepted (its end
 * is below), by bisection on the dense output; the step start when it already starts below.
 */
export function crossingTime(step: Dop853, i: number, threshold: number): number {
  let lo = step.tOld;
  let hi = step.tNew;
  if (!(step.yOld[i]! >= threshold)) return lo;
  for (let it = 0; it < 60 && hi - lo > 1e-14 * Math.max(1, Math.abs(hi)); it++) {
    const mid = 0.5 * (lo + hi);
    if (step.denseComponent(i, mid) < threshold) hi = mid;
    else lo = mid;
  }
  return hi;
}
