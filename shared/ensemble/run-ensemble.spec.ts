import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
import { compileChain } from '../model/chain-kernel';
import {
  validateEnsembleRequest,
  type EnsembleRequest,
} from '../analyses-contract/ensemble-contract';
import { runEnsembleMembers, ensembleTimes, writeEnsembleMembers } from './run-ensemble-members';
import {
  assembleEnsemble,
  bandColumnCount,
  bandColumns,
  summariseEnsemble,
  quantileSorted,
} from './summarise-ensemble';
import { memberGenerator } from './member-generator';
import { sampleDistribution } from './distribution';
import { ModelValidationError } from '../model/validation-issue';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

const request = (body: object): EnsembleRequest => {
  const v = validateEnsembleRequest(body);
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  return v.value;
};
const run = (req: EnsembleRequest) => {
  const m = runEnsembleMembers(req, 0, req.members);
  return summariseEnsemble(req, m.series, m.crossings);
};
// Logistic producer (r = 1, K = 1) with its grazer absent: the grazer stays at 0, so the
// producer follows Verhulst's law exactly, x(t) = 1 / (1 + (1/x0 - 1) e^{-t}), increasing in x0.
const logistic = (t: number, x0: number) => 1 / (1 + (1 / x0 - 1) * Math.exp(-t));
const producerOnly = (initialStates: object[], members: number, extra: object = {}) => ({
  model: benchmarkChain(3),
  initial: { algae: 0.05, grazers: 0, fish: 0 },
  horizon: 6,
  samples: 7,
  members,
  seed: 20240611,
  initialStates,
  ...extra,
});

describe('ensembles', () => {
  // With zero uncertainty every member is the deterministic trajectory; reference: odex 2.0.4
  // at rtol 1e-12 (an independent integrator from npm).
  it('collapses every band onto the deterministic trajectory without uncertainty', () => {
    const req = request({
      model: benchmarkChain(3),
      initial: BENCHMARK_INITIAL,
      horizon: 50,
      samples: 11,
      members: 5,
      seed: 7,
      tolerance: 1e-10,
    });
    const r = run(req);
    const kernel = compileChain(req.model);
    const y = new Float64Array(3);
    const d = new Float64Array(3);
    const solver = new Solver(3);
    solver.relativeTolerance = 1e-12;
    solver.absoluteTolerance = 1e-12;
    solver.denseOutput = true;
    const ref: number[][] = [];
    solver.solve(
      (t, v) => {
        y.set(v);
        kernel.rhs(t, y, d);
        return Array.from(d);
      },
      0,
      [0.76, 0.16, 9.9],
      50,
      solver.grid(5, (_t, v) => {
        ref.push(v.slice());
      }),
    );
    expect(r.times).toEqual(ensembleTimes(50, 11));
    ['algae', 'grazers', 'fish'].forEach((id, i) => {
      const b = r.bands[id]!;
      r.times.forEach((_, s) => {
        for (const p of [b.p5, b.p25, b.p50, b.p75, b.p95]) expect(p[s]).toBe(b.p50[s]);
        const want = ref[s]![i]!;
        expect(Math.abs(b.p50[s]! - want)).toBeLessThanOrEqual(1e-7 * Math.max(1, want));
      });
    });
  });

  // Uniform x0 on [0.01, 0.1]: the q-quantile of x(t) is x(t; 0.01 + 0.09 q). The empirical
  // quantile of M draws lies within q ± 4·sqrt(q(1-q)/M) in probability (binomial order
  // statistics, common practice), mapped through the monotone solution.
  it('matches the analytic quantiles of logistic growth from a uniform start', () => {
    const M = 2000;
    const req = request(
      producerOnly(
        [{ level: 'algae', distribution: { kind: 'uniform', min: 0.01, max: 0.1 } }],
        M,
        {
          extinction: { algae: 0.03 },
        },
      ),
    );
    const r = run(req);
    const bands = r.bands['algae']!;
    r.times.forEach((t, s) => {
      for (const q of [5, 25, 50, 75, 95] as const) {
        const p = q / 100;
        const d = 4 * Math.sqrt((p * (1 - p)) / M);
        const lo = logistic(t, 0.01 + 0.09 * Math.max(0, p - d));
        const hi = logistic(t, 0.01 + 0.09 * Math.min(1, p + d));
        const v = bands[`p${q}`][s]!;
        expect(v).toBeGreaterThanOrEqual(lo);
        expect(v).toBeLessThanOrEqual(hi);
      }
    });
    // P(x0 < 0.03) = 2/9 at t = 0; logistic growth never falls, so it stays there.
    const below = r.belowThreshold['algae']!;
    const sd = Math.sqrt(((2 / 9) * (7 / 9)) / M);
    expect(Math.abs(below[0]! - 2 / 9)).toBeLessThan(4 * sd);
    expect(new Set(below).size).toBe(1);
    // The absent grazer is below any positive threshold from the start.
    expect(r.belowThreshold['grazers']!.every((p) => p === 1)).toBe(true);
  });

  // Log-normal x0 (median 0.05, σ = 0.3): quantile exp(ln 0.05 + σ z_q) with the standard
  // normal quantiles z_0.05 = −1.644854, z_0.25 = −0.674490 (standard tables); the sampling sd
  // of an empirical quantile on the log scale is σ·sqrt(q(1-q)/M)/φ(z_q) (delta method).
  it('matches the analytic quantiles from a log-normal start', () => {
    const M = 2000;
    const sigma = 0.3;
    const req = request(
      producerOnly(
        [{ level: 'algae', distribution: { kind: 'lognormal', median: 0.05, sigma } }],
        M,
      ),
    );
    const r = run(req);
    const z = { 5: -1.6448536269514722, 25: -0.6744897501960817, 50: 0 } as Record<number, number>;
    z[75] = -z[25]!;
    z[95] = -z[5]!;
    r.times.forEach((t, s) => {
      for (const q of [5, 25, 50, 75, 95] as const) {
        const p = q / 100;
        const phi = Math.exp(-(z[q]! ** 2) / 2) / Math.sqrt(2 * Math.PI);
        const spread = (4 * sigma * Math.sqrt((p * (1 - p)) / M)) / phi;
        const at = (dz: number) => logistic(t, Math.exp(Math.log(0.05) + sigma * z[q]! + dz));
        const v = r.bands['algae']![`p${q}`][s]!;
        expect(v).toBeGreaterThanOrEqual(at(-spread));
        expect(v).toBeLessThanOrEqual(at(spread));
      }
    });
  });

  it('is reproducible bit for bit and independent of how members are split', () => {
    const req = request(
      producerOnly(
        [{ level: 'algae', distribution: { kind: 'normal', mean: 0.05, sd: 0.01, min: 0.001 } }],
        30,
        {
          parameters: [
            {
              pointer: '/levels/0/growthRate',
              distribution: { kind: 'lognormal', median: 1, sigma: 0.2 },
            },
          ],
        },
      ),
    );
    const whole = runEnsembleMembers(req, 0, 30);
    const a = runEnsembleMembers(req, 0, 11);
    const b = runEnsembleMembers(req, 11, 30);
    expect(Array.from(whole.series)).toEqual([...a.series, ...b.series]);
    expect(run(req)).toEqual(run(req));
  });

  // What the pool relies on: members written in any order into one buffer, and the band
  // columns computed in any split, give exactly the in-order run (Object.is on every value).
  it('gives the same members in any order and the same bands in any split of columns', () => {
    const req = request(
      producerOnly(
        [{ level: 'algae', distribution: { kind: 'uniform', min: 0.01, max: 0.1 } }],
        23,
        { extinction: { algae: 0.03 } },
      ),
    );
    const whole = runEnsembleMembers(req, 0, 23);
    const series = new Float64Array(whole.series.length);
    const crossings = new Float64Array(whole.crossings.length);
    const shuffled = [
      7, 22, 0, 15, 3, 11, 19, 1, 8, 14, 5, 21, 2, 9, 17, 4, 12, 20, 6, 13, 10, 18, 16,
    ];
    writeEnsembleMembers(req, shuffled, series, crossings);
    expect(series).toEqual(whole.series);
    expect(crossings).toEqual(whole.crossings);
    const columns = bandColumnCount(req);
    const all = bandColumns(req, series, 0, columns);
    const split = [0, 5, 6, 13, columns].flatMap((from, k, cuts) =>
      k + 1 < cuts.length ? Array.from(bandColumns(req, series, from, cuts[k + 1]!)) : [],
    );
    expect(split).toEqual(Array.from(all));
    expect(assembleEnsemble(req, all, crossings)).toEqual(run(req));
  });

  it('keeps a truncated normal inside its bounds', () => {
    const rng = memberGenerator(1, 0);
    const d = { kind: 'normal', mean: 0, sd: 1, min: -0.5, max: 2 } as const;
    for (let i = 0; i < 2000; i++) {
      const v = sampleDistribution(d, rng);
      expect(v).toBeGreaterThanOrEqual(-0.5);
      expect(v).toBeLessThanOrEqual(2);
    }
  });

  it('points at the distribution when a draw makes the model invalid', () => {
    const req = request(
      producerOnly([], 5, {
        parameters: [
          { pointer: '/levels/0/growthRate', distribution: { kind: 'normal', mean: 0, sd: 1 } },
        ],
      }),
    );
    expect(() => runEnsembleMembers(req, 0, 5)).toThrow(ModelValidationError);
    try {
      runEnsembleMembers(req, 0, 5);
    } catch (e) {
      expect((e as ModelValidationError).errors[0]!.pointer).toBe('/parameters/0/distribution');
    }
  });

  // Hyndman & Fan (1996) definition 7 on 1..5: the 25th percentile is 2, the 10th is 1.4.
  it('uses linear interpolation between order statistics for percentiles', () => {
    expect(quantileSorted([1, 2, 3, 4, 5], 0.25)).toBe(2);
    expect(quantileSorted([1, 2, 3, 4, 5], 0.1)).toBeCloseTo(1.4, 14);
  });

  it.each([
    [{ members: 0 }, '/members'],
    [{ members: 10_001 }, '/members'],
    [{ seed: -1 }, '/seed'],
    [
      { initialStates: [{ level: 'otters', distribution: { kind: 'uniform', min: 0, max: 1 } }] },
      '/initialStates/0/level',
    ],
    [
      { initialStates: [{ level: 'algae', distribution: { kind: 'uniform', min: 1, max: 0 } }] },
      '/initialStates/0/distribution',
    ],
    [
      {
        parameters: [
          { pointer: '/levels/0/colour', distribution: { kind: 'uniform', min: 0, max: 1 } },
        ],
      },
      '/parameters/0/pointer',
    ],
    [
      { initialStates: [{ level: 'algae', distribution: { kind: 'beta', a: 1 } }] },
      '/initialStates/0/distribution/kind',
    ],
  ])('rejects %o with a pointer at %s', (over, pointer) => {
    const v = validateEnsembleRequest({ ...producerOnly([], 10), ...over });
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors.map((e) => e.pointer)).toContain(pointer);
  });
});
