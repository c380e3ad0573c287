import ode45 from 'ode45-cash-karp';
import { describe, expect, it } from 'vitest';
import {
  compileChain,
  HASTINGS_POWELL_BENCHMARK as B,
  parseModel,
  project,
  type ChainModel,
} from '@tropline/core';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(a), Math.abs(b));

describe('logistic growth (Verhulst 1838: N(t) = K / (1 + (K/N0 − 1)·e^(−r·t)))', () => {
  // With the consumer absent (N1 = 0) the producer is exactly logistic.
  const model = parseModel({
    timeUnit: 'day',
    levels: [
      { id: 'algae', name: 'Algae', unit: 'g C m^-2', growthRate: 0.7, carryingCapacity: 35 },
      {
        id: 'grazers',
        name: 'Grazers',
        unit: 'g C m^-2',
        attackRate: 1,
        handlingTime: 0.1,
        efficiency: 0.3,
        mortality: 0.1,
      },
    ],
  });
  it.each([1e-8, 1e-11])('matches the exact solution at tolerance %s', (tolerance) => {
    const r = project({
      model,
      initial: { algae: 0.35, grazers: 0 },
      horizon: 30,
      samples: 61,
      tolerance,
    });
    r.times.forEach((t, k) => {
      const exact = 35 / (1 + (35 / 0.35 - 1) * Math.exp(-0.7 * t));
      expect(Math.abs(r.series.algae![k]! - exact)).toBeLessThanOrEqual(
        100 * tolerance * Math.max(1, exact),
      );
      expect(r.series.grazers![k]).toBe(0);
    });
  });
});

describe('Lotka–Volterra first integral (Lotka 1925, Volterra 1926)', () => {
  // Linear response (h = 0) and a carrying capacity so large that the logistic term is
  // negligible (relative 1e-12): V = e·a·x − m·ln x + a·y − r·ln y is then conserved.
  const r0 = 1,
    a = 1,
    e = 0.5,
    m = 0.5;
  const model = parseModel({
    timeUnit: 'year',
    levels: [
      { id: 'prey', name: 'Prey', unit: 'u', growthRate: r0, carryingCapacity: 1e12 },
      {
        id: 'predator',
        name: 'Predator',
        unit: 'u',
        attackRate: a,
        handlingTime: 0,
        efficiency: e,
        mortality: m,
      },
    ],
  });
  const V = (x: number, y: number) => e * a * x - m * Math.log(x) + a * y - r0 * Math.log(y);
  it('keeps V constant over about 50 periods at tolerance 1e-10', () => {
    // Small-amplitude period 2π/√(r·m) ≈ 8.9; this orbit is larger, period ≈ 10.
    const p = project({
      model,
      initial: { prey: 2, predator: 0.5 },
      horizon: 500,
      samples: 2001,
      tolerance: 1e-10,
    });
    const v0 = V(2, 0.5);
    let drift = 0;
    p.times.forEach(
      (_, k) =>
        (drift = Math.max(drift, Math.abs(V(p.series.prey![k]!, p.series.predator![k]!) - v0))),
    );
    expect(drift).toBeLessThan(1e-7 * Math.abs(v0));
  });
});

describe('a second integrator agrees with odex (ode45-cash-karp, npm)', () => {
  function cashKarp(model: ChainModel, y0: number[], t1: number): number[] {
    const k = compileChain(model);
    const y = new Float64Array(y0.length);
    const d = new Float64Array(y0.length);
    const integ = ode45(
      [...y0],
      (dydt, yy, t) => {
        y.set(yy);
        k.rhs(t, y, d);
        for (let i = 0; i < d.length; i++) dydt[i] = d[i]!;
      },
      0,
      1e-3,
      { tol: 1e-12, verbose: false },
    );
    integ.steps(Infinity, t1);
    expect(integ.t).toBeCloseTo(t1, 12);
    return integ.y;
  }

  it.each([10, 50, 100])('on the benchmark to t = %s (rtol 1e-12)', (t1) => {
    const ck = cashKarp(B.model, [0.8, 0.2, 9], t1);
    const ox = project({
      model: B.model,
      initial: B.initial,
      horizon: t1,
      samples: 2,
      tolerance: 1e-12,
    });
    ['x', 'y', 'z'].forEach((id, i) => expect(rel(ox.series[id]![1]!, ck[i]!)).toBeLessThan(1e-8));
  });
});
