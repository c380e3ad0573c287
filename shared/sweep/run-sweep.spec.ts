import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
import { compileChain } from '../model/chain-kernel';
import { withParameter } from '../model/parameter-pointer';
import { validateSweepRequest, type SweepRequest } from '../analyses-contract/sweep-contract';
import { AnalysisBoundsError } from '../analyses-contract/analysis-limits';
import { assertSweepBounds, runSweepRange, sweepValues } from './run-sweep';
import { LAKE_DEMO, UPLAND_DEMO } from '../model/presets';
import { findEquilibria } from '../equilibria/find-equilibria';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

const body = (over: object = {}) => ({
  model: benchmarkChain(3),
  initial: BENCHMARK_INITIAL,
  parameter: '/levels/1/handlingTime',
  from: 2.2 / 5,
  to: 3 / 5,
  steps: 3,
  observe: 'fish',
  transient: 3000,
  window: 2000,
  ...over,
});
const request = (over: object = {}): SweepRequest => {
  const v = validateSweepRequest(body(over));
  if (!v.ok) throw new Error(JSON.stringify(v.errors));
  return v.value;
};
const distinct = (xs: number[], tol: number) =>
  xs.reduce<number[]>(
    (acc, x) => (acc.some((a) => Math.abs(a - x) <= tol) ? acc : [...acc, x]),
    [],
  );

describe('sweeps along b1 of the Hastings & Powell (1991) chain', () => {
  // Their bifurcation diagram (maxima of the top level against b1): one maximum on the cycle
  // near b1 = 2.2, two after the first period doubling (2.5), irregular bands near b1 = 3.
  it('reproduces one maximum, a doubled cycle and an irregular band', () => {
    const { points } = runSweepRange(request({ from: 2.2 / 5, to: 3 / 5, steps: 3 }), 0, 3);
    const [p22, p26, p30] = points as [(typeof points)[0], (typeof points)[0], (typeof points)[0]];
    expect(p22.value).toBeCloseTo(0.44, 14);
    expect(distinct(p22.maxima, 1e-5)).toHaveLength(1);
    expect(p22.regime).toBe('cycle');
    expect(distinct(p30.maxima, 1e-3).length).toBeGreaterThan(10);
    expect(p30.regime).toBe('chaotic');
    expect(p26.maxima.length).toBeGreaterThan(10);
  });

  it('finds two maxima per period at b1 = 2.5', () => {
    const { points } = runSweepRange(request({ from: 0.5, to: 0.5, steps: 2 }), 0, 1);
    expect(distinct(points[0]!.maxima, 1e-5)).toHaveLength(2);
    expect(points[0]!.regime).toBe('cycle');
  });

  // odex 2.0.4 at rtol 1e-12 with its own dense output as the independent reference: on the
  // doubled cycle (b1 = 2.5) every maximum located by DOP853's interpolant at rtol 1e-8 must
  // match a maximum of odex's trajectory to the tolerance.
  it('locates the maxima as the odex path does, to the tolerance', () => {
    const req = request({ from: 0.5, to: 0.5, steps: 2 });
    const ours = distinct(runSweepRange(req, 0, 1).points[0]!.maxima, 1e-6);
    const kernel = compileChain(withParameter(req.model, req.parameter, 0.5));
    const y = new Float64Array(3);
    const d = new Float64Array(3);
    const f = (t: number, v: number[]) => {
      y.set(v);
      kernel.rhs(t, y, d);
      return Array.from(d);
    };
    const solver = new Solver(3);
    solver.relativeTolerance = 1e-12;
    solver.absoluteTolerance = 1e-12;
    const start = solver.solve(f, 0, [0.76, 0.16, 9.9], 3000).y;
    solver.denseOutput = true;
    const refMaxima: number[] = [];
    let prev: number[] | undefined;
    solver.solve(f, 0, start, 1000, (_n, xold, x, yy, dense) => {
      if (prev && dense && f(xold, prev)[2]! > 0 && f(x, yy)[2]! <= 0) {
        let a = xold;
        let b = x;
        const g = (Math.sqrt(5) - 1) / 2;
        for (let i = 0; i < 80; i++) {
          const c = b - g * (b - a);
          const e = a + g * (b - a);
          if (dense(2, c) > dense(2, e)) b = e;
          else a = c;
        }
        refMaxima.push(dense(2, 0.5 * (a + b)));
      }
      prev = yy.slice();
    });
    const ref = distinct(refMaxima, 1e-6);
    expect(ref).toHaveLength(ours.length);
    for (const m of ours) {
      expect(ref.some((r) => Math.abs(r - m) <= 1e-6 * Math.abs(m))).toBe(true);
    }
  });

  it('gives the same points however the range is split (what keeps the pool deterministic)', () => {
    const req = request({ steps: 4, transient: 500, window: 500 });
    const whole = runSweepRange(req, 0, 4).points;
    const parts = [...runSweepRange(req, 0, 1).points, ...runSweepRange(req, 1, 4).points];
    expect(parts).toEqual(whole);
  });

  it('continues the state from value to value when asked, from the first value only', () => {
    const req = request({ steps: 3, transient: 500, window: 500, continuation: true });
    const cont = runSweepRange(req, 0, 3).points;
    const fresh = runSweepRange({ ...req, continuation: false }, 0, 1).points;
    expect(cont[0]).toEqual(fresh[0]);
    expect(cont).toHaveLength(3);
    expect(() => runSweepRange(req, 1, 3)).toThrow(RangeError);
  });

  // Benettin classification per point: b1 = 3 is chaotic (Hastings & Powell 1991), b1 = 2.2 a
  // cycle whose exponent is zero within its error (Benettin et al. 1980).
  it('classifies each value by its Lyapunov exponent when asked', () => {
    const req = request({
      from: 2.2 / 5,
      to: 3 / 5,
      steps: 2,
      regimeMethod: 'lyapunov',
      window: 5000,
    });
    const [cycle, chaos] = runSweepRange(req, 0, 2).points;
    expect(cycle!.regime).toBe('cycle');
    expect(chaos!.regime).toBe('chaotic');
    expect(chaos!.lyapunovExponent!.value).toBeGreaterThan(
      3 * chaos!.lyapunovExponent!.standardError,
    );
    expect(distinct(cycle!.maxima, 1e-5)).toHaveLength(1);
  });

  it('spaces values evenly and ends exactly on `to`', () => {
    expect(sweepValues(2, 6.2, 100)[99]).toBe(6.2);
    expect(sweepValues(0, 1, 5)).toEqual([0, 0.25, 0.5, 0.75, 1]);
  });
});

// The published mere (LAKE_DEMO) swept along the algal growth rate as <tropline-long-run> does:
// 36 values over 1–3, transient 1040, window 520 weeks, the perch observed. At r = 1 and 1 + 2/35
// the perch's peaks shrink towards 0 and the sweep called them irregular, i.e. chaotic.
describe('a top level dying out along a sweep', () => {
  const lake = (over: object = {}) => {
    const v = validateSweepRequest({
      model: LAKE_DEMO.model,
      initial: LAKE_DEMO.initial,
      parameter: '/levels/0/growthRate',
      from: 1,
      to: 1 + 2 / 35,
      steps: 2,
      observe: 'perch',
      transient: 1040,
      window: 520,
      ...over,
    });
    if (!v.ok) throw new Error(JSON.stringify(v.errors));
    return v.value;
  };
  const [algae, daphnia, perch] = LAKE_DEMO.model.levels as unknown as [
    { carryingCapacity: number },
    { attackRate: number; handlingTime: number; efficiency: number; mortality: number },
    { attackRate: number; handlingTime: number; efficiency: number; mortality: number },
  ];
  /**
   * The perch's invasion rate of the algae–Daphnia system without it: its per-capita growth
   * e·a·D/(1 + a·h·D) − m averaged along that boundary attractor (common practice: invasion
   * analysis; negative means the level cannot persist). Computed with odex 2.0.4 on the
   * two-level model, the average integrated as a third component: independent of our kernel,
   * DOP853 and the trend fit.
   */
  const invasionRate = (r: number) => {
    const f = (_t: number, [x, y]: number[]) => {
      const g1 = (daphnia.attackRate * x!) / (1 + daphnia.attackRate * daphnia.handlingTime * x!);
      const g2 = (perch.attackRate * y!) / (1 + perch.attackRate * perch.handlingTime * y!);
      return [
        r * x! * (1 - x! / algae.carryingCapacity) - g1 * y!,
        daphnia.efficiency * g1 * y! - daphnia.mortality * y!,
        perch.efficiency * g2 - perch.mortality,
      ];
    };
    const solver = new Solver(3);
    solver.relativeTolerance = 1e-10;
    solver.absoluteTolerance = 1e-10;
    const onCycle = solver.solve(
      f,
      0,
      [LAKE_DEMO.initial.algae!, LAKE_DEMO.initial.daphnia!, 0],
      2000,
    ).y;
    return solver.solve(f, 0, [onCycle[0]!, onCycle[1]!, 0], 5000).y[2]! / 5000;
  };

  it('calls the perch collapsing, though above its threshold, where it cannot invade', () => {
    const threshold = 1e-6 * 40 * 0.5 * 0.25; // 1e-6 × the perch's scale K·e1·e2
    for (const point of runSweepRange(lake(), 0, 2).points) {
      // Measured: −0.00741 at r = 1, −0.00677 at r = 1.057 (the fitted decline agrees to 0.3 %).
      expect(invasionRate(point.value)).toBeLessThan(-0.006);
      expect(point.regime).toBe('collapse');
      expect(point.maxima.at(-1)!).toBeGreaterThan(100 * threshold);
      expect(point.maxima.every((m, i, all) => i === 0 || m < all[i - 1]!)).toBe(true);
    }
  });

  it('keeps the verdict under other tolerances, transients and the Lyapunov method', () => {
    for (const over of [
      { tolerance: 1e-7 },
      { tolerance: 1e-10, transient: 2080 },
      { transient: 520, window: 1040 },
      { regimeMethod: 'lyapunov' },
    ]) {
      const regimes = runSweepRange(lake(over), 0, 2).points.map((p) => p.regime);
      expect(regimes, JSON.stringify(over)).toEqual(['collapse', 'collapse']);
    }
  });
});

// Hastings & Powell's chain at b1 = 2 has an attracting interior equilibrium (Jacobian
// eigenvalues −0.016686 ± 0.1223i, −0.3466; closed form, see assess-regime.spec): after a short
// transient its damped oscillation is not settled and its shrinking maxima do not recur, which
// the maxima method called chaotic (transient 200) or a cycle (transient 500).
describe('a damped approach to an attracting equilibrium', () => {
  it('is an equilibrium whatever the transient, window or method', () => {
    const interior = findEquilibria(benchmarkChain(2)).find((e) => e.kind === 'interior')!;
    expect(interior.stable).toBe(true);
    expect(interior.eigenvalues[0]!.re).toBeCloseTo(-0.016686, 5);
    for (const over of [
      { transient: 0, window: 300 },
      { transient: 200, window: 300 },
      { transient: 500, window: 500 },
      { transient: 500, window: 500, regimeMethod: 'lyapunov' },
      { transient: 1000, window: 1000, tolerance: 1e-10 },
    ]) {
      const [point] = runSweepRange(
        request({ from: 0.4, to: 0.4, steps: 2, ...over }),
        0,
        1,
      ).points;
      expect(point!.regime, JSON.stringify(over)).toBe('equilibrium');
    }
    // The maxima the old rule saw: still falling by more than its 1e-4 at transient 200.
    const [early] = runSweepRange(
      request({ from: 0.4, to: 0.4, steps: 2, transient: 200, window: 300 }),
      0,
      1,
    ).points;
    const m = early!.maxima;
    expect(m[0]! - m.at(-1)!).toBeGreaterThan(1e-4 * m[0]!);
  });

  // The published upland (UPLAND_DEMO, "settles") swept along deer mortality as
  // <tropline-long-run> does (0.2–0.5, transient 200, window 100 years): its interior
  // equilibrium is stable at every value (eigenvalues from the engine's Jacobian), and the
  // slow wolves leave damped oscillations in the window that read as chaos or a cycle before.
  it('labels the upland settling across its published range', () => {
    const v = validateSweepRequest({
      model: UPLAND_DEMO.model,
      initial: UPLAND_DEMO.initial,
      parameter: '/levels/1/mortality',
      from: 0.2,
      to: 0.5,
      steps: 8,
      observe: 'wolves',
      transient: 200,
      window: 100,
    });
    if (!v.ok) throw new Error(JSON.stringify(v.errors));
    for (const point of runSweepRange(v.value, 0, 8).points) {
      const model = withParameter(UPLAND_DEMO.model, '/levels/1/mortality', point.value);
      expect(findEquilibria(model).find((e) => e.kind === 'interior')!.stable).toBe(true);
      expect(point.regime, String(point.value)).toBe('equilibrium');
    }
  });
});

describe('sweep requests', () => {
  it.each([
    [{ parameter: '/levels/9/handlingTime' }, '/parameter'],
    [{ observe: 'otters' }, '/observe'],
    [{ steps: 1001 }, '/steps'],
    [{ window: 0 }, '/window'],
    [{ from: -0.1 }, '/from'],
    [{ regimeMethod: 'guess' }, '/regimeMethod'],
    [{ initial: { algae: 1 } }, '/initial/grazers'],
  ])('rejects %o with a pointer at %s', (over, pointer) => {
    const v = validateSweepRequest(body(over));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors.map((e) => e.pointer)).toContain(pointer);
  });

  it('refuses too much work with a typed error before running', () => {
    const req = request({ steps: 1000, transient: 50_000, window: 50_000 });
    expect(() => assertSweepBounds(req)).toThrow(AnalysisBoundsError);
    try {
      assertSweepBounds(req);
    } catch (e) {
      expect((e as AnalysisBoundsError).bound).toBe('work');
    }
  });
});
