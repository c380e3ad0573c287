import { describe, expect, it } from 'vitest';
import { LAKE_DEMO, UPLAND_DEMO } from '@tropline/core';
import { Dop853 } from '../integrate/dop853';
import { compileChain } from '../model/chain-kernel';
import { syntheticSeries } from './synthetic-series';

describe('syntheticSeries: seeded check data with known truth and known noise', () => {
  const times = Array.from({ length: 401 }, (_, i) => i * 0.5);
  const options = { times, logSigma: 0.1, seed: 42 };
  const data = syntheticSeries(UPLAND_DEMO.model, UPLAND_DEMO.initial, options);

  it('gives the same series for the same seed, bit for bit, and other series for another', () => {
    expect(syntheticSeries(UPLAND_DEMO.model, UPLAND_DEMO.initial, options)).toEqual(data);
    const other = syntheticSeries(UPLAND_DEMO.model, UPLAND_DEMO.initial, { ...options, seed: 43 });
    expect(other.truth).toEqual(data.truth);
    expect(other.levels.deer).not.toEqual(data.levels.deer);
  });

  it("samples the model's own trajectory (checked with a second integrator, DOP853)", () => {
    // syntheticSeries integrates with ODEX; DOP853 (Hairer, Nørsett & Wanner) is independent.
    const kernel = compileChain(UPLAND_DEMO.model);
    const ids = ['heather', 'deer', 'wolves'];
    const y0 = Float64Array.from(ids, (id) => UPLAND_DEMO.initial[id]!);
    const state = new Float64Array(3);
    const dop: number[][] = [[...y0]];
    new Dop853(3).integrate(
      kernel.rhs,
      0,
      y0,
      times.at(-1)!,
      new Float64Array(3),
      { relativeTolerance: 1e-11, absoluteTolerance: 1e-13 },
      (step) => {
        while (dop.length < times.length && times[dop.length]! <= step.tNew) {
          step.dense(times[dop.length]!, state);
          dop.push([...state]);
        }
      },
    );
    expect(dop).toHaveLength(times.length);
    ids.forEach((id, j) =>
      data.truth[id]!.forEach((v, i) =>
        expect(Math.abs(v - dop[i]![j]!) / v, `${id} at ${times[i]}`).toBeLessThan(1e-7),
      ),
    );
  });

  it('adds log-normal noise of the given σ: the log residuals have mean 0 and SD σ', () => {
    const logs = ['heather', 'deer', 'wolves'].flatMap((id) =>
      data.levels[id]!.map((v, i) => Math.log(v! / data.truth[id]![i]!)),
    );
    const n = logs.length;
    const mean = logs.reduce((a, b) => a + b, 0) / n;
    const sd = Math.sqrt(logs.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1));
    // Normal theory (common practice): SE(mean) = σ/√n, SE(sd) ≈ σ/√(2n); four of each.
    expect(Math.abs(mean)).toBeLessThan((4 * 0.1) / Math.sqrt(n));
    expect(Math.abs(sd - 0.1)).toBeLessThan((4 * 0.1) / Math.sqrt(2 * n));
    // The stated standard errors are σ times the value (the delta method on the log scale).
    expect(data.standardErrors.deer![7]).toBeCloseTo(data.levels.deer![7]! * 0.1, 3);
  });

  it('drops about the asked fraction of surveys and only the surveyed levels', () => {
    const sparse = syntheticSeries(LAKE_DEMO.model, LAKE_DEMO.initial, {
      times: Array.from({ length: 500 }, (_, i) => i),
      logSigma: 0.05,
      seed: 9,
      missing: 0.2,
      levels: ['algae', 'perch'],
    });
    expect(Object.keys(sparse.levels)).toEqual(['algae', 'perch']);
    const missed = sparse.levels.algae!.filter((v) => v === null).length;
    // Binomial(500, 0.2): mean 100, SD ≈ 8.9; four SDs either way.
    expect(missed).toBeGreaterThan(100 - 36);
    expect(missed).toBeLessThan(100 + 36);
  });
});
