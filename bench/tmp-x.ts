import fc from 'fast-check';
import { compileChain, integrateChain, levelScales, stateRecord } from '@tropline/core';
import { arbitraryChain, arbitraryState } from '../tests/reference/chain-arbitraries';
const samples = fc.sample(
  arbitraryChain().chain((m) => fc.tuple(fc.constant(m), arbitraryState(m))),
  { numRuns: 200, seed: 42 },
);
const [model, y0] = samples[152]!;
console.log(JSON.stringify(model), [...y0], [...levelScales(model)]);
let min = 0,
  tmin = 0;
let last: number[] = [];
console.log('model printed above?');
const r = integrateChain(compileChain(model), y0, {
  t1: 40,
  nonNegative: 0,
  scales: levelScales(model),
  absoluteTolerance: [...levelScales(model)].map((s) => 1e-8 * Math.min(1, s)),
  onStep: (_a, t, y) => {
    if (y[1]! < min) {
      min = y[1]!;
      tmin = t;
      last = [...y];
    }
  },
});
console.log(min, tmin, last, r.diagnostics, [...r.y]);
