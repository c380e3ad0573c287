import fc from 'fast-check';
import type { ChainModel } from '../../shared/model/chain-model';
import { levelScales } from '../../shared/model/chain-kernel';
import { parseModel } from '../../shared/model/model-validation';

// fast-check generators of valid chains and states, shared by the property tests. Not exported
// from the package: test support only (fast-check is a dev dependency).

const positive = (min: number, max: number) =>
  fc.double({ min: Math.log10(min), max: Math.log10(max), noNaN: true }).map((v) => 10 ** v);

/**
 * A random valid chain of 2–4 levels with optional type III, harvest and stocking. With
 * `wellScaled` (the default) the rates are drawn relative to the producer's r and each level's
 * scale, so the nondimensional groups stay within [0.1, 10] or so — the ecological range; without
 * it, raw values span five decades and many chains are stiff.
 */
export function arbitraryChain(options: { wellScaled?: boolean } = {}): fc.Arbitrary<ChainModel> {
  const wellScaled = options.wellScaled ?? true;
  const consumer = fc.record({
    attackRate: positive(0.01, 20),
    handlingTime: fc.oneof(fc.constant(0), positive(0.01, 20)),
    efficiency: positive(0.05, 1),
    mortality: positive(0.001, 1),
    response: fc.constantFrom<'type2' | 'type3' | undefined>(undefined, 'type2', 'type3'),
  });
  return fc
    .record({
      r: positive(0.1, 5),
      K: positive(0.1, 1000),
      consumers: fc.array(consumer, { minLength: 1, maxLength: 3 }),
      effort: fc.option(fc.tuple(fc.nat(3), positive(0.001, 0.5)), { nil: undefined }),
      quota: fc.option(fc.tuple(fc.nat(3), positive(0.001, 0.5)), { nil: undefined }),
      stocking: fc.option(fc.tuple(fc.nat(3), positive(0.001, 0.5)), { nil: undefined }),
    })
    .map(({ r, K, consumers, effort, quota, stocking }) => {
      const n = consumers.length + 1;
      const id = (i: number) => `level-${i}`;
      const levels = [
        { id: id(0), name: 'Producer', unit: 'u', growthRate: r, carryingCapacity: K },
        ...consumers.map((c, j) => {
          const { response, ...rest } = c;
          return {
            id: id(j + 1),
            name: `Consumer ${j + 1}`,
            unit: 'u',
            ...rest,
            ...(response ? { response } : {}),
          };
        }),
      ];
      const harvest = [
        ...(effort
          ? [{ level: id(effort[0] % n), kind: 'effort' as const, rate: effort[1] * r }]
          : []),
        ...(quota
          ? [{ level: id(quota[0] % n), kind: 'quota' as const, amount: quota[1] * r * K }]
          : []),
      ];
      const model = {
        timeUnit: 'year',
        levels,
        ...(harvest.length ? { harvest } : {}),
        ...(stocking
          ? { stocking: [{ level: id(stocking[0] % n), amount: stocking[1] * r * K * 0.01 }] }
          : {}),
      };
      if (!wellScaled) return parseModel(model);
      // Rescale consumers: â = a·Sⱼ/r ∈ [0.01, 20]-ish, b = a·h·Sⱼ₋₁ ≤ 20, m/r ≤ 1.
      let prev = K;
      for (let j = 1; j < n; j++) {
        const c = levels[j] as {
          attackRate: number;
          handlingTime: number;
          efficiency: number;
          mortality: number;
        };
        const S = prev * c.efficiency;
        const aHat = c.attackRate;
        c.attackRate = (aHat * r) / S;
        c.handlingTime = c.handlingTime / (c.attackRate * prev);
        c.mortality = c.mortality * r;
        prev = S;
      }
      return parseModel(model);
    });
}

/** A random non-negative state of the model, each level within 1e-3..1e2 of its scale. */
export function arbitraryState(model: ChainModel): fc.Arbitrary<Float64Array> {
  const scales = levelScales(model);
  return fc
    .tuple(...[...scales].map((s) => positive(1e-3 * s, 1e2 * s)))
    .map((v) => Float64Array.from(v));
}
