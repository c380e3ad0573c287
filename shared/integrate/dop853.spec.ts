import { describe, expect, it } from 'vitest';
import { Solver } from 'odex';
import { Dop853 } from './dop853';
import { Dop853OptionError, type RhsFunction } from './dop853-options';

const close = (a: number, b: number, tol: number) =>
  Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

const decay: RhsFunction = (_t, y, d) => {
  d[0] = -y[0]!;
};
const oscillator: RhsFunction = (_t, y, d) => {
  d[0] = y[1]!;
  d[1] = -y[0]!;
};
// Verhulst logistic x' = r x (1 - x/K) with r = 1.3, K = 2.
const logistic: RhsFunction = (_t, y, d) => {
  d[0] = 1.3 * y[0]! * (1 - y[0]! / 2);
};
const logisticExact = (t: number, x0: number) => 2 / (1 + (2 / x0 - 1) * Math.exp(-1.3 * t));
// Lorenz (1963, J. Atmos. Sci. 20:130-141) with his sigma = 10, r = 28, b = 8/3.
const lorenz: RhsFunction = (_t, y, d) => {
  d[0] = 10 * (y[1]! - y[0]!);
  d[1] = y[0]! * (28 - y[2]!) - y[1]!;
  d[2] = y[0]! * y[1]! - (8 / 3) * y[2]!;
};

describe('Dop853 on exact solutions', () => {
  // y' = -y has y = exp(-t) (closed form, common practice).
  it('integrates exponential decay to tolerance', () => {
    const s = new Dop853(1);
    const out = new Float64Array(1);
    const r = s.integrate(decay, 0, Float64Array.of(1), 5, out, {
      relativeTolerance: 1e-10,
      absoluteTolerance: 1e-14,
    });
    expect(r.outcome).toBe('completed');
    expect(r.t).toBe(5);
    expect(close(out[0]!, Math.exp(-5), 1e-9)).toBe(true);
    expect(r.evaluations).toBeGreaterThan(12 * r.accepted - 1);
  });

  // x'' = -x from (1, 0) is (cos t, -sin t) (closed form, common practice); tolerance
  // proportionality of an 8th-order method: a 1000-fold tighter rtol shrinks the error.
  it('keeps the harmonic oscillator on its circle and converges with the tolerance', () => {
    const s = new Dop853(2);
    const out = new Float64Array(2);
    const errors = [1e-6, 1e-9].map((rtol) => {
      s.integrate(oscillator, 0, Float64Array.of(1, 0), 20 * Math.PI + 1, out, {
        relativeTolerance: rtol,
        absoluteTolerance: rtol,
      });
      return Math.hypot(out[0]! - Math.cos(1), out[1]! + Math.sin(1));
    });
    expect(errors[0]!).toBeLessThan(1e-4);
    expect(errors[1]!).toBeLessThan(errors[0]! / 50);
  });

  // Verhulst logistic growth, exact solution K / (1 + (K/x0 - 1) e^{-rt}); dense output of
  // order 7 must match it between steps, not only at step ends.
  it('matches the Verhulst solution at step ends and through the dense output', () => {
    const s = new Dop853(1);
    const out = new Float64Array(1);
    const y = new Float64Array(1);
    let worst = 0;
    const r = s.integrate(
      logistic,
      0,
      Float64Array.of(0.01),
      12,
      out,
      { relativeTolerance: 1e-10, absoluteTolerance: 1e-12 },
      (step) => {
        for (const frac of [0.25, 0.5, 0.9]) {
          const t = step.tOld + frac * (step.tNew - step.tOld);
          step.dense(t, y);
          worst = Math.max(worst, Math.abs(y[0]! - logisticExact(t, 0.01)));
          expect(step.denseComponent(0, t)).toBe(y[0]);
        }
        expect(step.denseComponent(0, step.tNew)).toBeCloseTo(step.yNew[0]!, 12);
      },
    );
    expect(r.outcome).toBe('completed');
    expect(worst).toBeLessThan(1e-8);
    expect(close(out[0]!, logisticExact(12, 0.01), 1e-9)).toBe(true);
  });

  // The monomial form must reproduce the nested interpolant (same polynomial, two layouts).
  it('gives monomial coefficients equal to the nested interpolant', () => {
    const s = new Dop853(2);
    const c = new Float64Array(8);
    s.integrate(
      oscillator,
      0,
      Float64Array.of(1, 0),
      3,
      new Float64Array(2),
      {
        relativeTolerance: 1e-6,
        absoluteTolerance: 1e-6,
        maxStep: 1,
      },
      (step) => {
        step.denseMonomials(1, c);
        const theta = 0.37;
        let v = 0;
        for (let j = 7; j >= 0; j--) v = v * theta + c[j]!;
        const t = step.tOld + theta * (step.tNew - step.tOld);
        expect(close(v, step.denseComponent(1, t), 1e-13)).toBe(true);
      },
    );
  });

  it('stops when the step callback returns false and leaves y0 untouched', () => {
    const s = new Dop853(1);
    const y0 = Float64Array.of(1);
    const r = s.integrate(
      decay,
      0,
      y0,
      10,
      new Float64Array(1),
      {
        relativeTolerance: 1e-8,
        absoluteTolerance: 1e-10,
      },
      (step) => step.tNew < 1,
    );
    expect(r.outcome).toBe('stopped');
    expect(r.t).toBeGreaterThanOrEqual(1);
    expect(y0[0]).toBe(1);
  });

  it('reports max-steps instead of running on', () => {
    const s = new Dop853(3);
    const r = s.integrate(lorenz, 0, Float64Array.of(1, 1, 1), 100, new Float64Array(3), {
      relativeTolerance: 1e-10,
      absoluteTolerance: 1e-10,
      maxSteps: 50,
    });
    expect(r.outcome).toBe('max-steps');
    expect(r.steps).toBe(50);
  });
});

describe('Dop853 against odex 2.0.4 (a reference integrator from npm)', () => {
  // Lorenz system over t ∈ [0, 2], short enough that chaos does not amplify the tolerance
  // difference beyond 1e-6; both at rtol 1e-12.
  it('agrees with odex on the Lorenz system', () => {
    const s = new Dop853(3);
    const out = new Float64Array(3);
    s.integrate(lorenz, 0, Float64Array.of(1, 1, 1), 2, out, {
      relativeTolerance: 1e-12,
      absoluteTolerance: 1e-12,
    });
    const odex = new Solver(3);
    odex.relativeTolerance = 1e-12;
    odex.absoluteTolerance = 1e-12;
    const d = new Float64Array(3);
    const y = new Float64Array(3);
    const ref = odex.solve(
      (t, v) => {
        y.set(v);
        lorenz(t, y, d);
        return Array.from(d);
      },
      0,
      [1, 1, 1],
      2,
    );
    for (let i = 0; i < 3; i++) expect(close(out[i]!, ref.y[i]!, 1e-7)).toBe(true);
  });
});

describe('Dop853 option checks', () => {
  const s = new Dop853(1);
  const run = (o: object, t1 = 1) =>
    s.integrate(decay, 0, Float64Array.of(1), t1, new Float64Array(1), {
      relativeTolerance: 1e-6,
      absoluteTolerance: 1e-9,
      ...o,
    });
  it.each([
    ['relativeTolerance', { relativeTolerance: 0 }],
    ['relativeTolerance', { relativeTolerance: Number.NaN }],
    ['absoluteTolerance', { absoluteTolerance: -1 }],
    ['maxSteps', { maxSteps: 1.5 }],
    ['initialStep', { initialStep: Number.POSITIVE_INFINITY }],
    ['maxStep', { maxStep: 0 }],
    ['errorComponents', { errorComponents: 2 }],
  ])('rejects a bad %s', (option, o) => {
    expect(() => run(o)).toThrow(Dop853OptionError);
    try {
      run(o);
    } catch (e) {
      expect((e as Dop853OptionError).option).toBe(option);
    }
  });
  it('rejects a non-finite end time', () => {
    expect(() => run({}, Number.POSITIVE_INFINITY)).toThrow(Dop853OptionError);
  });
  it('returns at once for an empty interval', () => {
    const r = run({}, 0);
    expect(r.outcome).toBe('completed');
    expect(r.evaluations).toBe(0);
  });
});
