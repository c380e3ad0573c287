import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { compileChain } from '../model/chain-kernel';
import { initialVector } from '../model/initial-vector';
import { withParameter } from '../model/parameter-pointer';
import { assessRegime } from './assess-regime';
import {
  driftingMaxima,
  DYING_OUT_NOTE,
  predictabilityHorizon,
  TRANSIENT_NOTE,
} from './classify-regime';
import { UPLAND_DEMO } from '../model/presets';
import { LevelTrend } from './level-trend';
import { lyapunovSpectrum } from '../lyapunov/lyapunov-spectrum';
import { findEquilibria } from '../equilibria/find-equilibria';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

const close = (a: number, b: number, tol: number) =>
  Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

describe('regimes of the Hastings & Powell (1991) chain', () => {
  // Hastings & Powell (1991): chaotic dynamics at b1 = 3 with a small positive exponent.
  it('finds b1 = 3 chaotic with a small positive exponent and its horizon', () => {
    const r = assessRegime(benchmarkChain(3), BENCHMARK_INITIAL);
    expect(r.regime).toBe('chaotic');
    const { value, standardError } = r.lyapunovExponent;
    expect(value).toBeGreaterThan(3 * standardError);
    expect(value).toBeLessThan(0.1);
    // ln(Δ/δ0)/λ with the defaults δ0 = 1 %, Δ = 100 % (the definition).
    expect(close(r.predictabilityHorizon!, Math.log(100) / value, 1e-12)).toBe(true);
  });

  // Hastings & Powell (1991): a limit cycle at the low end of the b1 range (their Fig. 2 shows
  // a single maximum there); a cycle's exponent is 0 (Benettin et al. 1980).
  it('finds b1 = 2.2 a cycle with exponent zero within its error and a period', () => {
    const r = assessRegime(benchmarkChain(2.2), BENCHMARK_INITIAL);
    expect(r.regime).toBe('cycle');
    expect(Math.abs(r.lyapunovExponent.value)).toBeLessThan(
      Math.max(3 * r.lyapunovExponent.standardError, 1e-3),
    );
    expect(r.maximaPerPeriod).toBe(1);
    expect(r.period).toBeGreaterThan(10);
    expect(r.predictabilityNote).toBe('not limited by chaos');
    expect(r.predictabilityHorizon).toBeUndefined();
  });

  // Period doubling in Hastings & Powell's diagram: two maxima per period at b1 = 2.5.
  it('finds two maxima per period after the first period doubling (b1 = 2.5)', () => {
    const r = assessRegime(benchmarkChain(2.5), BENCHMARK_INITIAL);
    expect(r.regime).toBe('cycle');
    expect(r.maximaPerPeriod).toBe(2);
  });

  // Benettin et al. (1980): at an attracting equilibrium the largest exponent is the largest
  // real part of the Jacobian's eigenvalues; eigenvalues from ml-matrix (a reference library).
  it('matches the largest eigenvalue real part at an attracting equilibrium (b1 = 2)', () => {
    const model = benchmarkChain(2);
    const r = assessRegime(model, BENCHMARK_INITIAL, { exponents: 3 });
    expect(r.regime).toBe('equilibrium');
    const kernel = compileChain(model);
    const run = lyapunovSpectrum(kernel, initialVector(model, BENCHMARK_INITIAL), {
      transient: 5000,
      window: 100,
    });
    const jac = new Float64Array(9);
    kernel.jacobian(0, run.state, jac);
    const rows = [0, 1, 2].map((i) => Array.from(jac.subarray(3 * i, 3 * i + 3)));
    const re = new EigenvalueDecomposition(new Matrix(rows)).realEigenvalues;
    const top = Math.max(...re);
    expect(top).toBeLessThan(0);
    expect(Math.abs(r.lyapunovExponent.value - top)).toBeLessThan(
      4 * r.lyapunovExponent.standardError + 1e-4,
    );
    // The same against the engine's closed-form interior equilibrium (exact, from the Jacobian).
    const interior = findEquilibria(model).find((e) => e.kind === 'interior' && e.feasible)!;
    expect(interior.stable).toBe(true);
    expect(Math.abs(interior.eigenvalues[0]!.re - top)).toBeLessThan(1e-8);
    expect(Math.abs(r.lyapunovExponent.value - interior.eigenvalues[0]!.re)).toBeLessThan(
      4 * r.lyapunovExponent.standardError + 1e-4,
    );
    // Sum of the spectrum = trace of J at the equilibrium (Liouville; the divergence identity).
    const sum = r.spectrum.values.reduce((a, b) => a + b, 0);
    expect(close(sum, jac[0]! + jac[4]! + jac[8]!, 1e-6)).toBe(true);
  });

  // General identity: for the full spectrum, Σλ_i equals the time-mean divergence of the vector
  // field along the orbit (Liouville's formula; e.g. Ott, Chaos in Dynamical Systems, §4.4).
  it('gives a full spectrum that sums to the mean divergence along the chaotic orbit', () => {
    const r = assessRegime(benchmarkChain(3), BENCHMARK_INITIAL, { exponents: 3 });
    const sum = r.spectrum.values.reduce((a, b) => a + b, 0);
    expect(close(sum, r.meanDivergence, 1e-6)).toBe(true);
    expect(r.meanDivergence).toBeLessThan(0); // dissipative
    // One exponent of an autonomous flow with a non-equilibrium attractor is zero.
    expect(Math.abs(r.spectrum.values[1]!)).toBeLessThan(4 * r.spectrum.standardErrors[1]! + 1e-3);
  });

  it.each([
    [3, 'chaotic'],
    [2.2, 'cycle'],
    [2, 'equilibrium'],
  ])('keeps b1 = %s %s under other tolerances and transients', (b1, regime) => {
    const model = benchmarkChain(b1);
    for (const options of [
      { tolerance: 1e-7, transient: 3000 },
      { tolerance: 1e-10, transient: 6000 },
    ]) {
      expect(assessRegime(model, BENCHMARK_INITIAL, options).regime).toBe(regime);
    }
  });

  // A short window leaves the exponent's error wide; the irregular maxima still tell chaos from
  // a cycle, and the answer says the evidence is weaker.
  it('calls a short-window chaotic run chaotic, with a note', () => {
    const r = assessRegime(benchmarkChain(3), BENCHMARK_INITIAL, { transient: 3000, window: 1000 });
    expect(r.regime).toBe('chaotic');
    expect(r.lyapunovExponent.value).toBeLessThan(3 * r.lyapunovExponent.standardError);
    expect(r.regimeNote).toMatch(/longer window/);
  });

  // A top predator whose mortality exceeds its largest possible gain a2/b2 = 0.05 cannot persist
  // (common practice: the invasion condition of the Holling type II predator).
  it('reports collapse of a predator that cannot persist', () => {
    const model = withParameter(benchmarkChain(3), '/levels/2/mortality', 0.06);
    const r = assessRegime(model, BENCHMARK_INITIAL, { transient: 2000, window: 1000 });
    expect(r.regime).toBe('collapse');
    expect(r.collapsedLevels).toEqual(['fish']);
  });

  // At b1 = 1 the predator-free equilibrium (x*, y*, 0) of the chain is x* = d1/(a1 − b1·d1),
  // y* = (1 − x*)(1 + b1·x*)/a1 (zeros of the first two equations) and attracts within z = 0
  // (b1 = 1 puts the prey isocline's hump at x = (1 − 1/b1)/2 = 0, left of x*: no Hopf point;
  // Rosenzweig 1971). The Jacobian's z row there is (0, 0, a2·y*/(1 + b2·y*) − d2), so that
  // entry is the top level's invasion rate: negative, z → 0 like e^{λt} (common practice:
  // the invasion condition of the boundary equilibrium). d2 = 0.0172 makes it −0.00299 and the
  // fish falls only to ~0.01 in the window, far above its 1e-6 threshold: it must still be
  // reported as collapsing, not as an equilibrium of the levels left or as chaos.
  const [a1, b1, d1, a2, b2] = [5, 1, 0.4, 0.1, 2];
  const xStar = d1 / (a1 - b1 * d1);
  const yStar = ((1 - xStar) * (1 + b1 * xStar)) / a1;
  const invasionRate = (d2: number) => (a2 * yStar) / (1 + b2 * yStar) - d2;

  it('reports a top level that cannot invade its boundary equilibrium as collapsing', () => {
    const d2 = 0.0172;
    const model = withParameter(benchmarkChain(b1), '/levels/2/mortality', d2);
    const lambda = invasionRate(d2);
    expect(lambda).toBeCloseTo(-0.0029916, 7);
    // The engine's closed-form boundary equilibrium has that eigenvalue (the same Jacobian).
    const boundary = findEquilibria(model).find((e) => e.kind === 'partial-chain')!;
    expect(boundary.stable).toBe(true);
    expect(boundary.eigenvalues.some((e) => Math.abs(e.re - lambda) < 1e-12)).toBe(true);

    const options = { transient: 1000, window: 1000 };
    const trend = new LevelTrend(3, options.window);
    const run = lyapunovSpectrum(
      compileChain(model),
      initialVector(model, BENCHMARK_INITIAL),
      options,
      (step) => trend.observe(step),
    );
    expect(run.windowMin[2]).toBeGreaterThan(1e-3); // the threshold alone would not see it
    // The fitted decline is the invasion rate (measured: within 5e-4 relative).
    expect(Math.abs(trend.trends().rates[2]! / lambda - 1)).toBeLessThan(2e-3);

    const r = assessRegime(model, BENCHMARK_INITIAL, options);
    expect(r.regime).toBe('collapse');
    expect(r.collapsedLevels).toEqual(['fish']);
    expect(r.regimeNote).toBe(DYING_OUT_NOTE);
  });

  // The counterpart: with Hastings & Powell's own d2 = 0.01 the invasion rate is +0.0042, the
  // fish persists and the chain settles on its interior equilibrium; its trend is zero.
  it('keeps a top level that can invade out of collapse', () => {
    const model = withParameter(benchmarkChain(b1), '/levels/2/mortality', 0.01);
    expect(invasionRate(0.01)).toBeGreaterThan(0.004);
    for (const options of [{ transient: 1000, window: 1000 }, {}]) {
      expect(assessRegime(model, BENCHMARK_INITIAL, options).regime).toBe('equilibrium');
    }
  });
});

// The invented upland (UPLAND_DEMO) over the short window its portal widget uses (transient
// 200, window 100 years), along the wolves' mortality. Past 0.2774 the predator-free
// equilibrium (heather, deer, 0) attracts — the engine's closed form and Jacobian — so the
// wolves cannot invade it; below, they can. Over 100 years the wolves fall only 1.3× (0.28) and
// 3.7× (0.29): the tenfold rule alone did not see it, and the window read chaotic.
describe('the upland on a short window', () => {
  const at = (mortality: number) =>
    withParameter(UPLAND_DEMO.model, '/levels/2/mortality', mortality);
  const short = { transient: 200, window: 100 };

  it.each([0.28, 0.29])(
    'reports wolves at mortality %s dying out toward the equilibrium without them',
    (m) => {
      const boundary = findEquilibria(at(m)).find((e) => e.kind === 'partial-chain')!;
      expect(boundary.stable).toBe(true);
      expect(findEquilibria(at(m)).some((e) => e.kind === 'interior' && e.feasible)).toBe(false);
      // The wolves' invasion rate there: the eigenvalue along the wolves' axis (measured:
      // −2.6e-3 at 0.28 and −1.3e-2 at 0.29 per year, as the window's fitted decline).
      const invasion = Math.max(...boundary.eigenvalues.map((e) => e.re));
      expect(invasion).toBeLessThan(0);
      const r = assessRegime(at(m), UPLAND_DEMO.initial, short);
      expect(r.regime).toBe('collapse');
      expect(r.collapsedLevels).toEqual(['wolves']);
      expect(r.regimeNote).toBe(DYING_OUT_NOTE);
    },
  );

  // Below the threshold the wolves invade (the boundary equilibrium is unstable): the deer's
  // slow decline inside the window (−1.0e-3 ± 2e-4 per year at 0.246, an orbit spiralling onto
  // its cycle) is no dying out, and maxima that still rise or fall one way are no chaos, even
  // with the exponent's estimate positive within its wide error.
  it.each([0.246, 0.26, 0.27])('reads mortality %s as a transient, not chaos or collapse', (m) => {
    const boundary = findEquilibria(at(m)).find((e) => e.kind === 'partial-chain')!;
    expect(boundary.stable).toBe(false);
    const r = assessRegime(at(m), UPLAND_DEMO.initial, short);
    expect(r.lyapunovExponent.value).toBeGreaterThan(0);
    expect(r.lyapunovExponent.value).toBeLessThan(3 * r.lyapunovExponent.standardError);
    expect(r.regime).toBe('cycle');
    expect(r.regimeNote).toBe(TRANSIENT_NOTE);
    // A long window shows the cycle itself (period from recurring maxima).
    const long = assessRegime(at(m), UPLAND_DEMO.initial, { transient: 5000, window: 5000 });
    expect(long.regime).toBe('cycle');
  });
});

describe('driftingMaxima', () => {
  it('tells maxima drifting one way (at some lag up to 4) from irregular ones', () => {
    expect(driftingMaxima([])).toBe(true); // too few to show chaos
    expect(driftingMaxima([1, 2])).toBe(true);
    expect(driftingMaxima([0.18, 0.21, 0.25, 0.28, 0.31, 0.34])).toBe(true); // rising onto a cycle
    // Two interleaved sequences converging onto a period-2 cycle.
    expect(driftingMaxima([11.0, 12.0, 11.3, 11.8, 11.4, 11.7, 11.45, 11.65])).toBe(true);
    // The benchmark's chaotic maxima at b1 = 3 (our sweep, transient 200, window 300).
    expect(driftingMaxima([8.693, 10.45, 8.039, 8.542, 10.32, 8.332, 8.936])).toBe(false);
    // Steps within the tolerance count either way.
    expect(driftingMaxima([5, 5.0001, 5, 5.0001, 5.2], 1e-4)).toBe(true);
  });
});

describe('predictabilityHorizon', () => {
  it('is ln(Δ/δ0)/λ for λ > 0 and undefined otherwise', () => {
    expect(predictabilityHorizon(0.5, 0.01, 1)).toBeCloseTo(Math.log(100) / 0.5, 12);
    expect(predictabilityHorizon(0)).toBeUndefined();
    expect(predictabilityHorizon(-0.1)).toBeUndefined();
    expect(predictabilityHorizon(Number.NaN)).toBeUndefined();
    expect(() => predictabilityHorizon(1, 0, 1)).toThrow(RangeError);
  });
});
