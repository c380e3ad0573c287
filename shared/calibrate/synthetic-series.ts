import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { memberGenerator } from '../ensemble/member-generator';
import { integrateChain } from '../integrate/integrate-chain';
import { compileChain, levelScales } from '../model/chain-kernel';
import type { ChainModel } from '../model/chain-model';

/** How to make check data from a known model. */
export interface SyntheticOptions {
  /** Survey times on the model's time axis, strictly increasing (uneven is fine). */
  readonly times: readonly number[];
  /** Standard deviation of the log-normal observation error (0.1 ≈ 10 %). */
  readonly logSigma: number;
  /** Seed of pure-rand's xoroshiro128+: the same seed gives the same data, bit for bit. */
  readonly seed: number;
  /** Levels surveyed (default all). */
  readonly levels?: readonly string[];
  /** Fraction of values dropped as missed surveys, chosen by the same seeded stream. */
  readonly missing?: number;
}

/** Monitoring series with their truth. */
export interface SyntheticSeries {
  readonly times: number[];
  /** Noisy observations (null where missed). */
  readonly levels: Record<string, (number | null)[]>;
  /** Log-scale standard error of each value as a standard error in the level's unit. */
  readonly standardErrors: Record<string, (number | null)[]>;
  /** The noiseless trajectory at the same times. */
  readonly truth: Record<string, number[]>;
}

function standardNormal(rng: RandomGenerator): number {
  const u1 = 1 - uniformFloat64(rng); // (0, 1]: keeps the logarithm finite
  const u2 = uniformFloat64(rng);
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/**
 * Generates surveys of a known model: the trajectory from `initial` at t = 0 (ODEX, tolerance
 * 1e-11, an integrator independent of the fit's DOP853) sampled at `times`, each value times
 * e^(σ·z) with z standard normal (log-normal error, common practice for counts and biomass).
 * Each level draws from its own seeded stream.
 */
export function syntheticSeries(
  model: ChainModel,
  initial: Readonly<Record<string, number>>,
  options: SyntheticOptions,
): SyntheticSeries {
  const kernel = compileChain(model);
  const ids = model.levels.map((l) => l.id);
  const n = options.times.length;
  const truth: Record<string, number[]> = Object.fromEntries(ids.map((id) => [id, []]));
  const t1 = options.times[n - 1]!;
  const record = (y: ArrayLike<number>) => ids.forEach((id, i) => truth[id]!.push(y[i]!));
  const y0 = ids.map((id) => initial[id]!);
  const start = options.times[0] === 0 ? 1 : 0;
  if (start) record(y0);
  integrateChain(kernel, y0, {
    t1,
    tolerance: 1e-11,
    scales: levelScales(model),
    sampleTimes: options.times.slice(start),
    onSample: (_k, _t, y) => record(y),
  });
  const surveyed = options.levels ?? ids;
  const levels: SyntheticSeries['levels'] = {};
  const standardErrors: SyntheticSeries['standardErrors'] = {};
  surveyed.forEach((id) => {
    const rng = memberGenerator(options.seed, ids.indexOf(id));
    levels[id] = truth[id]!.map((v) => {
      const noisy = v * Math.exp(options.logSigma * standardNormal(rng));
      const missed = options.missing !== undefined && uniformFloat64(rng) < options.missing;
      return missed ? null : Number(noisy.toPrecision(6));
    });
    standardErrors[id] = levels[id]!.map((v) =>
      v === null ? null : Number((v * options.logSigma).toPrecision(4)),
    );
  });
  return { times: [...options.times], levels, standardErrors, truth };
}
