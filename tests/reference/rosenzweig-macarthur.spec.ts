import { describe, expect, it } from 'vitest';
import {
  compileChain,
  findEquilibria,
  parseModel,
  ROSENZWEIG_MACARTHUR,
  withParameter,
  type ChainModel,
} from '@tropline/core';
import { bisect, mathjsEigenvalues } from './eigen-reference';

// Rosenzweig & MacArthur (1963, Am. Nat. 97:209–223); Rosenzweig (1971, Science 171:385–387).
// Interior equilibrium x* = m/(e·a − m·a·h), y* = r(1 − x*/K)(1 + a·h·x*)/a; Hopf where x* meets
// the hump of the prey isocline, x* = (K − 1/(a·h))/2, i.e. at K_H = 2x* + 1/(a·h).
const r = 0.9,
  a = 2.5,
  h = 0.4,
  e = 0.6,
  m = 0.3;
const modelAt = (K: number): ChainModel =>
  parseModel({
    timeUnit: 'year',
    levels: [
      { id: 'prey', name: 'Prey', unit: 'animals km^-2', growthRate: r, carryingCapacity: K },
      {
        id: 'predator',
        name: 'Predator',
        unit: 'animals km^-2',
        attackRate: a,
        handlingTime: h,
        efficiency: e,
        mortality: m,
      },
    ],
  });
const xStar = m / (e * a - m * a * h);
const hopfK = 2 * xStar + 1 / (a * h);

function interior(model: ChainModel) {
  return findEquilibria(model).find((q) => q.kind === 'interior')!;
}

describe('Rosenzweig–MacArthur two-level model', () => {
  it.each([0.5, 1.5, 3])('has the analytic interior equilibrium at K = %s', (K) => {
    const eq = interior(modelAt(K));
    const yStar = (r * (1 - xStar / K) * (1 + a * h * xStar)) / a;
    expect(eq.state.prey).toBeCloseTo(xStar, 12);
    expect(eq.state.predator).toBeCloseTo(yStar, 12);
    expect(eq.method).toBe('closed-form');
  });

  it('loses stability exactly where x* meets the isocline hump (Hopf), numerically too', () => {
    const lead = (K: number) => interior(modelAt(K)).eigenvalues[0]!.re;
    expect(interior(modelAt(hopfK * 0.9)).stable).toBe(true);
    expect(interior(modelAt(hopfK * 1.1)).stable).toBe(false);
    expect(interior(modelAt(hopfK * 1.1)).classification).toBe('unstable spiral');
    const numeric = bisect(lead, hopfK * 0.5, hopfK * 2, 1e-13);
    expect(Math.abs(numeric - hopfK)).toBeLessThan(1e-9 * hopfK);
    // At the Hopf point the eigenvalues are a purely imaginary pair.
    const atHopf = interior(modelAt(hopfK)).eigenvalues;
    expect(Math.abs(atHopf[0]!.re)).toBeLessThan(1e-12);
    expect(Math.abs(atHopf[0]!.im)).toBeGreaterThan(0.01);
  });

  it('eigenvalues agree with mathjs eigs', () => {
    for (const K of [0.5, hopfK, 3]) {
      const model = modelAt(K);
      const eq = interior(model);
      const jac = new Float64Array(4);
      compileChain(model).jacobian(0, Float64Array.of(eq.state.prey!, eq.state.predator!), jac);
      const ref = mathjsEigenvalues(jac, 2);
      eq.eigenvalues.forEach((v, i) => {
        expect(v.re).toBeCloseTo(ref[i]!.re, 10);
        expect(v.im).toBeCloseTo(ref[i]!.im, 10);
      });
    }
  });

  it('the preset is enriched past its Hopf point and cycles', () => {
    const model = ROSENZWEIG_MACARTHUR.model;
    const eq = interior(model);
    expect(eq.stable).toBe(false);
    expect(withParameter(model, '/levels/0/carryingCapacity', 0.3)).toBeTruthy();
    expect(interior(withParameter(model, '/levels/0/carryingCapacity', 0.3)).stable).toBe(true);
  });
});
