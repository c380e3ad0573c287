import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';

/** A 32-bit mix (the finaliser of MurmurHash3, common practice for seeding). */
function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

/**
 * The generator of ensemble member `index` under `seed`: pure-rand's xoroshiro128+ started from
 * four words hashed from (seed, index, word). Each member owns its stream, so a member's draws
 * do not depend on which worker runs it or in what order: the ensemble is reproducible bit for
 * bit whatever the pool size.
 */
export function memberGenerator(seed: number, index: number): RandomGenerator {
  const words = [0, 1, 2, 3].map((w) =>
    fmix32(fmix32(seed ^ 0x9e3779b9) + Math.imul(index + 1, 0x632be5ab) + Math.imul(w, 0x27d4eb2f)),
  );
  if (!words.some((w) => w !== 0)) words[0] = 1; // the all-zero state is a fixed point
  return xoroshiro128plusFromState(words);
}
