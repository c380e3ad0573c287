import { describe, expect, it } from 'vitest';
import {
  compileChain,
  computeEquilibria,
  equilibriaResponseSchema,
  ModelValidationError,
  findEquilibria,
  fromHastingsPowell,
  HASTINGS_POWELL_BENCHMARK as B,
  hastingsPowellGroups,
  LAKE_DEMO,
  nondimensionalGroups,
  project,
  withParameter,
  type ChainModel,
} from '@tropline/core';
import { bisect, mathjsEigenvalues } from './eigen-reference';

// Hastings & Powell (1991, Ecology 72:896–903): a1 = 5, a2 = 0.1, b2 = 2, d1 = 0.4, d2 = 0.01.
const a1 = 5,
  a2 = 0.1,
  b2 = 2,
  d1 = 0.4,
  d2 = 0.01;
const atB1 = (b1: number): ChainModel => withParameter(B.model, '/levels/1/handlingTime', b1 / a1);
const rel = (p: number, q: number) => Math.abs(p - q) / Math.max(1, Math.abs(p), Math.abs(q));

/** The equilibria derived by hand from the paper's nondimensional equations (independent). */
function handEquilibria(b1: number): number[][] {
  const out: number[][] = [
    [0, 0, 0],
    [1, 0, 0],
  ];
  const xe = d1 / (a1 - b1 * d1); // y' = 0 with z = 0
  out.push([xe, ((1 - xe) * (1 + b1 * xe)) / a1, 0]);
  const ys = d2 / (a2 - b2 * d2); // z' = 0
  // x' = 0: (1 − x)(1 + b1·x) = a1·y*  →  b1·x² + (1 − b1)·x + (a1·y* − 1) = 0
  const disc = (1 - b1) ** 2 - 4 * b1 * (a1 * ys - 1);
  for (const s of [1, -1]) {
    const x = (-(1 - b1) + s * Math.sqrt(disc)) / (2 * b1);
    out.push([x, ys, ((a1 * x) / (1 + b1 * x) - d1) * ((1 + b2 * ys) / a2)]);
  }
  return out;
}

describe('Hastings–Powell benchmark equilibria (Hastings & Powell 1991)', () => {
  it.each([2, 3, 6])('finds every equilibrium at b1 = %s, matching the hand derivation', (b1) => {
    const found = findEquilibria(atB1(b1));
    const hand = handEquilibria(b1);
    expect(found).toHaveLength(hand.length);
    for (const h of hand) {
      const match = found.find((f) =>
        h.every((v, i) => rel(v, Object.values(f.state)[i]!) < 1e-10),
      );
      expect(match, `equilibrium ${h.join(', ')}`).toBeDefined();
      expect(match!.feasible).toBe(h.every((v) => v >= 0));
    }
  });

  it.each([2, 3, 6])('eigenvalues at b1 = %s agree with mathjs eigs', (b1) => {
    const model = atB1(b1);
    const k = compileChain(model);
    const jac = new Float64Array(9);
    for (const eq of findEquilibria(model)) {
      k.jacobian(0, Float64Array.from(Object.values(eq.state)), jac);
      const ref = mathjsEigenvalues(jac, 3);
      eq.eigenvalues.forEach((v, i) => {
        expect(Math.abs(v.re - ref[i]!.re)).toBeLessThan(1e-9);
        expect(Math.abs(v.im - ref[i]!.im)).toBeLessThan(1e-9);
      });
    }
  });

  it('classifies the feasible interior: stable at b1 = 2, unstable (saddle focus) at 3 and 6', () => {
    const interior = (b1: number) =>
      findEquilibria(atB1(b1)).find((q) => q.kind === 'interior' && q.feasible)!;
    expect(interior(2).stable).toBe(true);
    expect(interior(2).classification).toBe('stable spiral');
    expect(interior(3).classification).toBe('saddle focus');
    expect(interior(6).classification).toBe('saddle focus');
    // The three-level extinction state is a saddle: the producer can invade.
    expect(findEquilibria(atB1(3)).find((q) => q.kind === 'extinction')!.classification).toBe(
      'saddle',
    );
  });

  it('finds where the interior loses stability along b1, by eigenvalues and by Routh–Hurwitz', () => {
    const interiorState = (b1: number) =>
      Float64Array.from(
        Object.values(
          findEquilibria(atB1(b1)).find((q) => q.kind === 'interior' && q.feasible)!.state,
        ),
      );
    const lead = (b1: number) =>
      findEquilibria(atB1(b1)).find((q) => q.kind === 'interior' && q.feasible)!.eigenvalues[0]!.re;
    // Routh–Hurwitz for λ³ + c1λ² + c2λ + c3: stable iff c1, c3 > 0 and c1·c2 > c3 (common practice).
    const hurwitz = (b1: number) => {
      const j = new Float64Array(9);
      compileChain(atB1(b1)).jacobian(0, interiorState(b1), j);
      const [A, Bq, C, D, E, F, G, H, I] = j as unknown as number[];
      const c1 = -(A! + E! + I!);
      const c2 = A! * E! - Bq! * D! + A! * I! - C! * G! + E! * I! - F! * H!;
      const c3 = -(A! * (E! * I! - F! * H!) - Bq! * (D! * I! - F! * G!) + C! * (D! * H! - E! * G!));
      return c3 - c1 * c2; // < 0 when stable
    };
    const byEigen = bisect(lead, 2, 3, 1e-12);
    const byHurwitz = bisect(hurwitz, 2, 3, 1e-12);
    expect(Math.abs(byEigen - byHurwitz)).toBeLessThan(1e-9);
    // The value this engine finds (computed here, not from the paper): b1 ≈ 2.11379 (2.1137865…).
    expect(byEigen).toBeCloseTo(2.1137865, 6);
  });
});

describe('benchmark trajectories: rtol 1e-8 against rtol 1e-12', () => {
  const run = (tolerance: number) =>
    project({ model: B.model, initial: B.initial, horizon: 4000, samples: 4001, tolerance });
  const loose = run(1e-8);
  const tight = run(1e-12);
  const firstExceeding = (threshold: number) =>
    loose.times.find((_, k) =>
      ['x', 'y', 'z'].some(
        (id) =>
          Math.abs(loose.series[id]![k]! - tight.series[id]![k]!) >
          threshold * Math.max(1, Math.abs(tight.series[id]![k]!)),
      ),
    );
  // Found on this engine (relative to max(1, |value|), sampled every time unit): 1e-6 first
  // exceeded at t = 1234, 1e-4 at 1772, 1e-2 at 2296, 10 % at 2421, 50 % at 3222.
  it('agree to 1e-6 up to t = 1200, 1e-4 up to 1700 and 1e-2 up to 2200', () => {
    expect(firstExceeding(1e-6)).toBeGreaterThan(1200);
    expect(firstExceeding(1e-4)).toBeGreaterThan(1700);
    expect(firstExceeding(1e-2)).toBeGreaterThan(2200);
  });
  it('then part company, as chaos requires: differences of 50 % before t = 4000', () => {
    expect(firstExceeding(0.5)).toBeLessThan(4000);
  });
});

describe('nondimensional view (Hastings & Powell 1991 scaling)', () => {
  it('the benchmark preset is the paper’s groups', () => {
    expect(hastingsPowellGroups(B.model)).toEqual({
      a1: 5,
      b1: 3,
      a2: 0.1,
      b2: 2,
      d1: 0.4,
      d2: 0.01,
    });
  });

  it('the invented lake in real units maps exactly onto the benchmark, and back', () => {
    const g = hastingsPowellGroups(LAKE_DEMO.model);
    const want = { a1: 5, b1: 3, a2: 0.1, b2: 2, d1: 0.4, d2: 0.01 };
    for (const [k, v] of Object.entries(want))
      expect(rel(g[k as keyof typeof g], v)).toBeLessThan(1e-14);
    const back = fromHastingsPowell(
      want,
      { growthRate: 2, carryingCapacity: 40, efficiencies: [0.5, 0.25] },
      LAKE_DEMO.model,
    );
    back.levels.forEach((level, i) => {
      for (const [k, v] of Object.entries(level)) {
        const orig = (LAKE_DEMO.model.levels[i] as Record<string, unknown>)[k];
        if (typeof v === 'number') expect(rel(v, orig as number)).toBeLessThan(1e-14);
        else expect(v).toEqual(orig);
      }
    });
    const groups = nondimensionalGroups(LAKE_DEMO.model);
    expect(groups.timeScale).toBe(0.5);
    expect(groups.stateScales).toEqual([40, 20, 5]);
  });

  it('the lake trajectory, rescaled, is the benchmark trajectory (t = r·T, x = N/S)', () => {
    const weeks = 60;
    const lake = project({
      model: LAKE_DEMO.model,
      initial: LAKE_DEMO.initial,
      horizon: weeks,
      samples: 61,
      tolerance: 1e-12,
    });
    const bench = project({
      model: B.model,
      initial: B.initial,
      horizon: 2 * weeks,
      samples: 61,
      tolerance: 1e-12,
    });
    const S = { algae: 40, daphnia: 20, perch: 5 };
    lake.times.forEach((_, k) => {
      expect(rel(lake.series.algae![k]! / S.algae, bench.series.x![k]!)).toBeLessThan(1e-8);
      expect(rel(lake.series.daphnia![k]! / S.daphnia, bench.series.y![k]!)).toBeLessThan(1e-8);
      expect(rel(lake.series.perch![k]! / S.perch, bench.series.z![k]!)).toBeLessThan(1e-8);
    });
  });
});

describe('the /equilibria computation', () => {
  it('answers the contract shape for the contract example and rejects bad bodies with pointers', () => {
    const res = computeEquilibria({ model: B.model });
    expect(equilibriaResponseSchema.safeParse(res).success).toBe(true);
    expect(res.equilibria.some((q) => q.kind === 'interior' && q.feasible)).toBe(true);
    expect(() => computeEquilibria({ model: { ...B.model, levels: [] } })).toThrow(
      ModelValidationError,
    );
  });
});
