import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileChain, levelScales, QUOTA_TAPER_FRACTION } from './chain-kernel';
import type { ChainModel } from './chain-model';
import { parseModel } from './model-validation';
import { HASTINGS_POWELL_BENCHMARK } from './presets';
import { arbitraryChain, arbitraryState } from '../../tests/reference/chain-arbitraries';

/** Central finite differences of the kernel's RHS (common practice; step ∝ ε^(1/3)). */
function finiteDifferenceJacobian(model: ChainModel, y: Float64Array): Float64Array {
  const k = compileChain(model);
  const n = k.dimension;
  const jac = new Float64Array(n * n);
  const fp = new Float64Array(n);
  const fm = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const h = 6e-6 * Math.max(Math.abs(y[j]!), 1e-3);
    const yp = Float64Array.from(y);
    const ym = Float64Array.from(y);
    yp[j]! += h;
    ym[j]! -= h;
    k.rhs(0, yp, fp);
    k.rhs(0, ym, fm);
    for (let i = 0; i < n; i++) jac[i * n + j] = (fp[i]! - fm[i]!) / (2 * h);
  }
  return jac;
}

describe('chain kernel', () => {
  it('is the Hastings–Powell right-hand side for the benchmark (Hastings & Powell 1991)', () => {
    const k = compileChain(HASTINGS_POWELL_BENCHMARK.model);
    const [x, y, z] = [0.8, 0.2, 9];
    const d = new Float64Array(3);
    k.rhs(0, Float64Array.of(x, y, z), d);
    const f1 = (5 * x) / (1 + 3 * x);
    const f2 = (0.1 * y) / (1 + 2 * y);
    expect(d[0]).toBeCloseTo(x * (1 - x) - f1 * y, 14);
    expect(d[1]).toBeCloseTo(f1 * y - f2 * z - 0.4 * y, 14);
    expect(d[2]).toBeCloseTo(f2 * z - 0.01 * z, 14);
  });

  it('tapers a quota to zero as the level goes to zero', () => {
    const model = parseModel({
      ...HASTINGS_POWELL_BENCHMARK.model,
      harvest: [{ level: 'z', kind: 'quota', amount: 0.5 }],
    });
    const k = compileChain(model);
    const d = new Float64Array(3);
    const s = QUOTA_TAPER_FRACTION * levelScales(model)[2]!;
    k.rhs(0, Float64Array.of(0.5, 0.2, 0), d);
    expect(d[2]).toBe(0);
    k.rhs(0, Float64Array.of(0.5, 0.2, s), d);
    const noHarvest = new Float64Array(3);
    compileChain(HASTINGS_POWELL_BENCHMARK.model).rhs(0, Float64Array.of(0.5, 0.2, s), noHarvest);
    expect(noHarvest[2]! - d[2]!).toBeCloseTo(0.25, 14); // half the quota at N = ε·S
  });

  it('matches central finite differences for random valid chains (property)', () => {
    fc.assert(
      fc.property(arbitraryChain(), fc.context(), (model, ctx) => {
        const n = model.levels.length;
        const y = Float64Array.from(
          levelScales(model),
          (s, i) => s * (0.05 + 0.37 * ((i * 7 + 3) % 5)),
        );
        const k = compileChain(model);
        const jac = new Float64Array(n * n);
        k.jacobian(0, y, jac);
        const fd = finiteDifferenceJacobian(model, y);
        const scale = Math.max(1, ...jac.map(Math.abs));
        for (let i = 0; i < n * n; i++) {
          ctx.log(`entry ${i}: ${jac[i]} vs ${fd[i]}`);
          expect(Math.abs(jac[i]! - fd[i]!)).toBeLessThanOrEqual(1e-5 * scale);
        }
      }),
      { numRuns: 300, seed: 20240601 },
    );
  });

  it('matches central finite differences at random states (property)', () => {
    fc.assert(
      fc.property(
        arbitraryChain().chain((m) => fc.tuple(fc.constant(m), arbitraryState(m))),
        ([model, y]) => {
          const n = model.levels.length;
          const jac = new Float64Array(n * n);
          compileChain(model).jacobian(0, y, jac);
          const fd = finiteDifferenceJacobian(model, y);
          const scale = Math.max(1, ...jac.map(Math.abs));
          for (let i = 0; i < n * n; i++)
            expect(Math.abs(jac[i]! - fd[i]!)).toBeLessThanOrEqual(1e-5 * scale);
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });

  it('allocates nothing per call (reuses its scratch)', () => {
    const k = compileChain(HASTINGS_POWELL_BENCHMARK.model);
    const y = Float64Array.of(0.8, 0.2, 9);
    const d1 = new Float64Array(3);
    const d2 = new Float64Array(3);
    k.rhs(0, y, d1);
    k.rhs(1, y, d2);
    expect([...d1]).toEqual([...d2]);
    expect([...y]).toEqual([0.8, 0.2, 9]);
  });
});
