import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
import { compileChain } from '../model/chain-kernel';
import { parseModel } from '../model/model-validation';
import {
  validateComparisonRequest,
  type ComparisonRequest,
} from '../analyses-contract/comparison-contract';
import { applyChanges, runScenario } from './compare-scenarios';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

// The api-contract's example: the benchmark chain at b1 = 3 with 2 % effort on the fish.
const harvested = parseModel({
  ...benchmarkChain(3),
  harvest: [{ level: 'fish', kind: 'effort', rate: 0.02 }],
});
const body = (over: object = {}) => ({
  model: harvested,
  initial: BENCHMARK_INITIAL,
  horizon: 200,
  window: 50,
  samples: 21,
  thresholds: { fish: 8 },
  regimeTransient: 1000,
  regimeWindow: 1000,
  scenarios: [
    { name: 'Heavier effort', changes: [{ pointer: '/model/harvest/0/rate', value: 0.05 }] },
    { name: 'Fish restocked', changes: [{ pointer: '/initial/fish', value: 12 }] },
  ],
  ...over,
});
const request = (over: object = {}): ComparisonRequest => {
  const v = validateComparisonRequest(body(over));
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  return v.value;
};

/** odex 2.0.4 at rtol 1e-12 on a 0.01 grid: the independent reference trajectory. */
function odexGrid(req: ComparisonRequest, index: number): { t: number[]; y: number[][] } {
  const { model, initial } = applyChanges(
    req.model,
    req.initial,
    index === 0 ? [] : req.scenarios[index - 1]!.changes,
  );
  const kernel = compileChain(model);
  const y = new Float64Array(3);
  const d = new Float64Array(3);
  const solver = new Solver(3);
  solver.relativeTolerance = 1e-12;
  solver.absoluteTolerance = 1e-12;
  solver.denseOutput = true;
  const out = { t: [] as number[], y: [] as number[][] };
  solver.solve(
    (t, v) => {
      y.set(v);
      kernel.rhs(t, y, d);
      return Array.from(d);
    },
    0,
    model.levels.map((l) => initial[l.id]!),
    req.horizon,
    solver.grid(0.01, (t, v) => {
      out.t.push(t);
      out.y.push(v.slice());
    }),
  );
  return out;
}

describe('scenario comparison', () => {
  it('reports value at horizon, window mean, minimum and threshold crossing as odex does', () => {
    const req = request();
    for (const index of [0, 1]) {
      const ours = runScenario(req, index);
      const ref = odexGrid(req, index);
      const fish = ours.levels['fish']!;
      const last = ref.y[ref.y.length - 1]![2]!;
      expect(Math.abs(fish.atHorizon - last)).toBeLessThan(1e-6 * last);
      // Trapezoid rule on the 0.01 grid over [150, 200]: error O(1e-4·|z''|), far below 1e-5.
      let area = 0;
      for (let k = 1; k < ref.t.length; k++) {
        if (ref.t[k - 1]! >= 150 - 1e-9) area += 0.005 * (ref.y[k - 1]![2]! + ref.y[k]![2]!);
      }
      expect(Math.abs(fish.windowMean - area / 50)).toBeLessThan(1e-5 * fish.windowMean);
      const gridMin = Math.min(...ref.y.map((v) => v[2]!));
      expect(fish.minimum).toBeLessThanOrEqual(gridMin * (1 + 1e-7));
      expect(gridMin - fish.minimum).toBeLessThan(1e-6);
      const firstBelow = ref.t.find((_, k) => ref.y[k]![2]! < 8);
      if (firstBelow === undefined) expect(fish.thresholdCrossing).toBeNull();
      else expect(Math.abs(fish.thresholdCrossing! - firstBelow)).toBeLessThan(0.011);
    }
  });

  it('names the baseline, keeps the alternatives in order and gives each a regime', () => {
    const req = request();
    const outs = [0, 1, 2].map((i) => runScenario(req, i));
    expect(outs.map((o) => o.name)).toEqual(['baseline', 'Heavier effort', 'Fish restocked']);
    for (const o of outs) {
      expect(['equilibrium', 'cycle', 'chaotic', 'collapse']).toContain(o.regime);
      expect(o.series['fish']).toHaveLength(21);
    }
    expect(outs[2]!.series['fish']![0]).toBe(12);
    // More effort on the top level lowers its mean (common practice: harvest removes biomass).
    expect(outs[1]!.levels['fish']!.windowMean).toBeLessThan(outs[0]!.levels['fish']!.windowMean);
  });

  it('never mutates the baseline when applying changes', () => {
    const req = request();
    const before = JSON.stringify(req.model);
    applyChanges(req.model, req.initial, req.scenarios[0]!.changes);
    expect(JSON.stringify(req.model)).toBe(before);
  });

  it.each([
    [{ scenarios: [] }, '/scenarios'],
    [{ window: 500 }, '/window'],
    [
      { scenarios: [{ name: 'x', changes: [{ pointer: '/model/levels/7/mortality', value: 1 }] }] },
      '/scenarios/0/changes/0/pointer',
    ],
    [
      { scenarios: [{ name: 'x', changes: [{ pointer: '/initial/otters', value: 1 }] }] },
      '/scenarios/0/changes/0/pointer',
    ],
    [{ scenarios: Array.from({ length: 6 }, () => ({ name: 'x', changes: [] })) }, '/scenarios'],
  ])('rejects %o with a pointer at %s', (over, pointer) => {
    const v = validateComparisonRequest(body(over));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors.map((e) => e.pointer)).toContain(pointer);
  });
});
