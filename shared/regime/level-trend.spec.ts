import { describe, expect, it } from 'vitest';
import { Dop853 } from '../integrate/dop853';
import type { RhsFunction } from '../integrate/dop853-options';
import { LevelTrend, TREND_PARTS } from './level-trend';

const WINDOW = 600;
const OMEGA = 0.7;
const PART = WINDOW / TREND_PARTS;

/** Runs `rhs` from y0 over [0, WINDOW] in steps of at most 1 and returns component 0's trend. */
function trendOf(rhs: RhsFunction, y0: number) {
  const y = Float64Array.of(y0);
  const trend = new LevelTrend(1, WINDOW);
  new Dop853(1).integrate(
    rhs,
    0,
    y,
    WINDOW,
    y,
    { relativeTolerance: 1e-10, absoluteTolerance: 0, maxStep: 1 },
    (step) => trend.observe(step),
  );
  const t = trend.trends();
  return { rate: t.rates[0]!, error: t.standardErrors[0]! };
}

/**
 * Least-squares slope of ln(exact part mean) against the parts' midpoints, from the exact
 * integral `integral(a, b)` of the solution over each part.
 */
function exactSlope(integral: (a: number, b: number) => number): number {
  const mids = Array.from({ length: TREND_PARTS }, (_, k) => (k + 0.5) * PART);
  const logs = mids.map((m) => Math.log(integral(m - PART / 2, m + PART / 2) / PART));
  const tm = mids.reduce((s, t) => s + t, 0) / TREND_PARTS;
  const lm = logs.reduce((s, l) => s + l, 0) / TREND_PARTS;
  let sty = 0;
  let stt = 0;
  for (let k = 0; k < TREND_PARTS; k++) {
    sty += (mids[k]! - tm) * (logs[k]! - lm);
    stt += (mids[k]! - tm) ** 2;
  }
  return sty / stt;
}

// ∫ₐᵇ (2 + sin ωt) dt and ∫ₐᵇ e^{λt}(2 + sin ωt) dt, exact (the second from the table integral
// ∫ e^{λt} sin ωt dt = e^{λt}(λ sin ωt − ω cos ωt)/(λ² + ω²)).
const sine = (a: number, b: number) =>
  2 * (b - a) + (Math.cos(OMEGA * a) - Math.cos(OMEGA * b)) / OMEGA;
const decayingSine = (lambda: number) => (a: number, b: number) => {
  const f = (t: number) =>
    (2 * Math.exp(lambda * t)) / lambda +
    (Math.exp(lambda * t) * (lambda * Math.sin(OMEGA * t) - OMEGA * Math.cos(OMEGA * t))) /
      (lambda ** 2 + OMEGA ** 2);
  return f(b) - f(a);
};

describe('LevelTrend', () => {
  // Exact solution: N' = λN gives N = N0·e^{λt}; each part mean is e^{λa}(e^{λΔ} − 1)/(λΔ), so
  // the logarithms of the means lie on a line of slope λ with no residual.
  it('recovers the rate of an exponential decline exactly', () => {
    const { rate, error } = trendOf((_t, y, d) => void (d[0] = -0.004 * y[0]!), 45);
    expect(Math.abs(rate + 0.004)).toBeLessThan(1e-9);
    expect(error).toBeLessThan(1e-9);
  });

  // Exact solution: N' = ω cos ωt gives N = 2 + sin ωt, a persisting oscillation; the slope is
  // that of its exact part means (near 0).
  it('gives a bounded oscillation the slope of its exact part means', () => {
    const { rate } = trendOf((t, _y, d) => void (d[0] = OMEGA * Math.cos(OMEGA * t)), 2);
    const exact = exactSlope(sine);
    expect(Math.abs(exact)).toBeLessThan(1e-4);
    // N is taken linear across a step (trapezoid rule, error O(h²ω²)); steps of at most 1.
    expect(Math.abs(rate - exact)).toBeLessThan(1e-6);
  });

  // Exact solution: N' = λN + ω·e^{λt}·cos ωt gives N = e^{λt}(2 + sin ωt): a decline seen
  // through an oscillation (a predator dying out on its prey's cycle) keeps the rate λ.
  it('finds the decline under an oscillation', () => {
    const lambda = -0.006;
    const { rate, error } = trendOf(
      (t, y, d) =>
        void (d[0] = lambda * y[0]! + OMEGA * Math.exp(lambda * t) * Math.cos(OMEGA * t)),
      2,
    );
    const exact = exactSlope(decayingSine(lambda));
    expect(Math.abs(exact - lambda)).toBeLessThan(1e-4);
    expect(Math.abs(rate - exact)).toBeLessThan(1e-6);
    expect(-rate).toBeGreaterThan(3 * error);
    // The naive endpoint estimate (ln N(T) − ln N(0))/T carries the phase instead.
    const naive = (lambda * WINDOW + Math.log((2 + Math.sin(OMEGA * WINDOW)) / 2)) / WINDOW;
    expect(Math.abs(naive - lambda)).toBeGreaterThan(10 * Math.abs(exact - lambda));
  });
});
