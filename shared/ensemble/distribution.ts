import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';

/**
 * An uncertainty distribution. `normal` and `lognormal` become truncated ones when `min`
 * and/or `max` are given (drawn by rejection, so the draw stays a pure function of the stream).
 * `lognormal` is given by its median e^μ and the standard deviation σ of its logarithm.
 */
export type Distribution =
  | {
      readonly kind: 'normal';
      readonly mean: number;
      readonly sd: number;
      readonly min?: number;
      readonly max?: number;
    }
  | {
      readonly kind: 'lognormal';
      readonly median: number;
      readonly sigma: number;
      readonly min?: number;
      readonly max?: number;
    }
  | { readonly kind: 'uniform'; readonly min: number; readonly max: number };

/** Most rejected draws before a truncated distribution is declared unusable. */
export const MAX_REJECTIONS = 10_000;

/** Raised when a truncation interval holds too little of its distribution to sample. */
export class DistributionError extends Error {
  override readonly name = 'DistributionError';
}

/** A standard normal deviate by the Box–Muller transform (cosine branch only, one per call). */
export function standardNormal(rng: RandomGenerator): number {
  const u1 = 1 - uniformFloat64(rng); // (0, 1]: keeps log finite
  const u2 = uniformFloat64(rng);
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/** One draw from `d` using (and advancing) `rng`. */
export function sampleDistribution(d: Distribution, rng: RandomGenerator): number {
  if (d.kind === 'uniform') return d.min + (d.max - d.min) * uniformFloat64(rng);
  const lo = d.min ?? Number.NEGATIVE_INFINITY;
  const hi = d.max ?? Number.POSITIVE_INFINITY;
  for (let tries = 0; tries < MAX_REJECTIONS; tries++) {
    const z = standardNormal(rng);
    const v = d.kind === 'normal' ? d.mean + d.sd * z : d.median * Math.exp(d.sigma * z);
    if (v >= lo && v <= hi) return v;
  }
  throw new DistributionError(
    `no draw within [${lo}, ${hi}] in ${MAX_REJECTIONS} tries: the truncation keeps too little`,
  );
}

/** The distribution's problems, as messages (empty when usable). */
export function distributionIssues(d: Distribution): string[] {
  const issues: string[] = [];
  if (d.kind === 'uniform' && !(d.max > d.min)) issues.push('max must be greater than min');
  if (d.kind === 'normal' && !(d.sd >= 0)) issues.push('sd must not be negative');
  if (d.kind === 'lognormal' && !(d.median > 0)) issues.push('median must be greater than zero');
  if (d.kind === 'lognormal' && !(d.sigma >= 0)) issues.push('sigma must not be negative');
  if (d.kind !== 'uniform' && d.min !== undefined && d.max !== undefined && !(d.max > d.min)) {
    issues.push('max must be greater than min');
  }
  return issues;
}
