import { describe, expect, it } from 'vitest';
import { compileChain } from '../model/chain-kernel';
import { parseModel } from '../model/model-validation';
import { specialiseChain } from './specialise-chain';
import { Dop853 } from '../integrate/dop853';
import { benchmarkChain } from '../../tests/reference/analyses-benchmark-chain';
import { memberGenerator } from '../ensemble/member-generator';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';

const consumer = (id: string, extra: object = {}) => ({
  id,
  name: id,
  unit: 'kg ha^-1',
  attackRate: 2.5,
  handlingTime: 0.7,
  efficiency: 0.6,
  mortality: 0.15,
  ...extra,
});
// Invented chains covering every term of the model family: type III response, effort and
// quota harvest, stocking, two and four levels.
const models = [
  benchmarkChain(3),
  parseModel({
    timeUnit: 'month',
    levels: [
      { id: 'sedge', name: 'Sedge', unit: 'kg ha^-1', growthRate: 0.8, carryingCapacity: 40 },
      consumer('voles', { response: 'type3' }),
    ],
    harvest: [{ level: 'voles', kind: 'quota', amount: 0.3 }],
    stocking: [{ level: 'sedge', amount: 0.05 }],
  }),
  parseModel({
    timeUnit: 'year',
    levels: [
      { id: 'diatoms', name: 'Diatoms', unit: 'g m^-3', growthRate: 2, carryingCapacity: 5 },
      consumer('daphnia'),
      consumer('perch', { response: 'type3' }),
      consumer('pike'),
    ],
    harvest: [
      { level: 'perch', kind: 'effort', rate: 0.04 },
      { level: 'pike', kind: 'quota', amount: 0.01 },
    ],
    stocking: [{ level: 'pike', amount: 0.002 }],
  }),
];

// compileChain is the reference implementation of the model's equations; the specialised
// kernel must agree with it to rounding on arbitrary states (relative 1e-13).
describe('specialiseChain', () => {
  it.each(models.map((m, i) => [i, m] as const))('matches compileChain (model %i)', (_i, model) => {
    const ref = compileChain(model);
    const fast = specialiseChain(model);
    const n = ref.dimension;
    expect(fast.dimension).toBe(n);
    expect(fast.ids).toEqual(ref.ids);
    const rng = memberGenerator(5, n);
    const y = new Float64Array(n);
    const [a, b] = [new Float64Array(n), new Float64Array(n)];
    const [ja, jb] = [new Float64Array(n * n), new Float64Array(n * n)];
    for (let trial = 0; trial < 200; trial++) {
      for (let i = 0; i < n; i++) y[i] = trial === 0 ? 0 : 10 * uniformFloat64(rng) ** 3;
      ref.rhs(0, y, a);
      fast.rhs(0, y, b);
      ref.jacobian(0, y, ja);
      fast.jacobian(0, y, jb);
      for (let i = 0; i < n; i++) {
        expect(Math.abs(a[i]! - b[i]!)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(a[i]!)));
      }
      for (let i = 0; i < n * n; i++) {
        expect(Math.abs(ja[i]! - jb[i]!)).toBeLessThanOrEqual(
          1e-13 * Math.max(1, Math.abs(ja[i]!)),
        );
      }
    }
  });
});

// The fused step attempt is dop853Attempt with the right-hand side written in; every sum is taken
// in the same order, so the whole run must agree bit for bit with the generic step, stage for
// stage (each accepted state and a dense-output point in every step).
describe('specialiseChain fused step', () => {
  it.each(models.map((m, i) => [i, m] as const))(
    'integrates exactly as the generic DOP853 step (model %i)',
    (_i, model) => {
      const kernel = specialiseChain(model);
      const n = kernel.dimension;
      expect(kernel.attempt).toBeTypeOf('function');
      const y0 = new Float64Array(n).fill(0.5);
      const run = (attempt: typeof kernel.attempt) => {
        const seen: number[] = [];
        const mid = new Float64Array(n);
        const out = new Float64Array(n);
        const stepper = new Dop853(n);
        const options = { relativeTolerance: 1e-8, absoluteTolerance: 1e-12, attempt };
        const result = stepper.integrate(kernel.rhs, 0, y0, 300, out, options, (step) => {
          seen.push(step.tNew, ...step.yNew);
          step.dense(0.5 * (step.tOld + step.tNew), mid);
          seen.push(...mid);
        });
        return { result, seen, out: [...out] };
      };
      const generic = run(undefined);
      const fused = run(kernel.attempt);
      expect(generic.result.accepted).toBeGreaterThan(100);
      expect(fused.result).toEqual(generic.result);
      expect(fused.out).toEqual(generic.out);
      expect(fused.seen.length).toBe(generic.seen.length);
      expect(fused.seen.every((v, k) => Object.is(v, generic.seen[k]))).toBe(true);
    },
  );
});
