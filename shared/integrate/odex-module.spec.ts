import { describe, expect, it } from 'vitest';
import { Outcome, Solver } from 'odex';

describe('odex through its shim', () => {
  // Exact solution of y' = -y is exp(-t) (common practice: the simplest closed form).
  it('integrates exponential decay to tolerance', () => {
    const s = new Solver(1);
    s.relativeTolerance = 1e-10;
    s.absoluteTolerance = 1e-12;
    const r = s.solve((_t, y) => [-y[0]!], 0, [1], 2);
    expect(r.outcome).toBe(Outcome.Converged);
    expect(Math.abs(r.y[0]! - Math.exp(-2))).toBeLessThan(1e-9);
  });
});
