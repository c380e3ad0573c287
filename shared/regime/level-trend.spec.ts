import { describe, expect, it } from 'vitest';
import { Dop853 } from '../integrate/dop853';
import type { RhsFunction } from '../integrate/dop853-options';
import { LevelTrend, TREND_PARTS } from './level-trend';

const WINDOW = 600;
const OMEGA = 0.7;

/** Runs `rhs` from y0 over [0, WINDOW] and returns the trend of component 0. */
function trendOf(rhs: RhsFunction, y0: number, maxStep?: number) {
  const y = Float64Array.of(y0);
  const trend = new LevelTrend(1, WINDOW);
  new Dop853(1).integrate(
    rhs,
    0,
    y,
    WINDOW,
    y,
    { relativeTolerance: 1e-10, absoluteTolerance: 0, ...(maxStep ? { maxStep } : {}) },
    (step) => trend.observe(step),
  );
  const t = trend.trends();
  return { rate: t.rates[0]!, error: t.standardErrors[0]! };
}

/**
 * Least-squares slope of the exact part means of sin(ωt) against the parts' midpoints: the mean
 * of sin over [a, b] is (cos ωa − cos ωb)/(ω(b − a)) (exact integral).
 */
function sineSlope(): number {
  const part = WINDOW / TREND_PARTS;
  const mids: number[] = [];
  const means: number[] = [];
  for (let k = 0; k < TREND_PARTS; k++) {
    const a = k * part;
    const b = a + part;
    mids.push(a + part / 2);
    means.push((Math.cos(OMEGA * a) - Math.cos(OMEGA * b)) / (OMEGA * part));
  }
  const tm = mids.reduce((s, t) => s + t, 0) / TREND_PARTS;
  const mm = means.reduce((s, m) => s + m, 0) / TREND_PARTS;
  let sty = 0;
  let stt = 0;
  for (let k = 0; k < TREND_PARTS; k++) {
    sty += (mids[k]! - tm) * (means[k]! - mm);
    stt += (mids[k]! - tm) ** 2;
  }
  return sty / stt;
}

describe('LevelTrend', () => {
  // Exact solution: N' = λN gives ln N = ln N0 + λt, a straight line, so every part mean lies on
  // it and the fitted slope is λ with no residual.
  it('recovers the rate of an exponential decline exactly', () => {
    const { rate, error } = trendOf((_t, y, d) => void (d[0] = -0.004 * y[0]!), 45);
    expect(Math.abs(rate + 0.004)).toBeLessThan(1e-10);
    expect(error).toBeLessThan(1e-10);
  });

  // Exact solution: N' = N·ω·cos ωt gives N = exp(sin ωt), a persisting oscillation whose
  // logarithm is bounded; the slope is that of the exact part means of sin ωt (near 0).
  it('gives a bounded oscillation the slope of its exact part means', () => {
    const { rate } = trendOf((t, y, d) => void (d[0] = y[0]! * OMEGA * Math.cos(OMEGA * t)), 1, 1);
    const exact = sineSlope(); // −3.63e-5
    expect(Math.abs(exact)).toBeLessThan(1e-4);
    // ln N is taken linear across a step (trapezoid rule, error O(h²ω²)); steps of at most 1.
    expect(Math.abs(rate - exact)).toBeLessThan(1e-6);
  });

  // Exact solution: N' = N(λ + ω cos ωt) gives ln N = λt + sin ωt: a decline seen through an
  // oscillation (a predator dying out on its prey's cycle) keeps the rate λ, phase removed.
  it('finds the decline under an oscillation', () => {
    const { rate, error } = trendOf(
      (t, y, d) => void (d[0] = y[0]! * (-0.006 + OMEGA * Math.cos(OMEGA * t))),
      0.05,
      1,
    );
    expect(Math.abs(rate - (-0.006 + sineSlope()))).toBeLessThan(1e-6);
    expect(-rate).toBeGreaterThan(3 * error);
    // The naive endpoint estimate (ln N(T) − ln N(0))/T carries the phase sin(ωT)/T instead.
    expect(Math.abs(Math.sin(OMEGA * WINDOW) / WINDOW)).toBeGreaterThan(10 * Math.abs(sineSlope()));
  });
});
