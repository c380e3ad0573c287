/** The first primes: Halton bases for up to six fitted values. */
const BASES = [2, 3, 5, 7, 11, 13];

/** Element `index` (≥ 1) of the van der Corput sequence in `base`: a point of (0, 1). */
function radicalInverse(index: number, base: number): number {
  let result = 0;
  let f = 1 / base;
  for (let i = index; i > 0; i = Math.floor(i / base)) {
    result += f * (i % base);
    f /= base;
  }
  return result;
}

/**
 * Optimiser starts in the unit box: the caller's current values first, then points of the
 * Halton sequence (well spread, and deterministic, so a calibration repeats bit for bit)
 * squeezed into [0.05, 0.95] to keep them off the bounds.
 */
export function startPoints(current: readonly number[], count: number): number[][] {
  const out = [current.slice()];
  for (let k = 1; k < count; k++) {
    out.push(current.map((_, j) => 0.05 + 0.9 * radicalInverse(k, BASES[j % BASES.length]!)));
  }
  return out;
}
