import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  compileChain,
  findEquilibria,
  IntegrationError,
  levelScales,
  ModelValidationError,
  project,
  stateRecord,
  validateProjectionRequest,
  CHAIN_PRESETS,
} from '@tropline/core';
import { arbitraryChain, arbitraryState } from './chain-arbitraries';

describe('engine properties (fast-check)', () => {
  it('random valid chains never produce negative or non-finite states', () => {
    fc.assert(
      fc.property(
        arbitraryChain().chain((m) => fc.tuple(fc.constant(m), arbitraryState(m))),
        ([model, y0]) => {
          const r = project({ model, initial: stateRecord(model, y0), horizon: 150, samples: 31 });
          for (const series of Object.values(r.series)) {
            for (const v of series) {
              expect(Number.isFinite(v)).toBe(true);
              expect(v).toBeGreaterThanOrEqual(0);
            }
          }
        },
      ),
      { numRuns: 100, seed: 42 },
    );
  });

  it('extreme (stiff) chains either project cleanly or end in a typed error', () => {
    fc.assert(
      fc.property(
        arbitraryChain({ wellScaled: false }).chain((m) =>
          fc.tuple(fc.constant(m), arbitraryState(m)),
        ),
        ([model, y0]) => {
          try {
            const r = project(
              { model, initial: stateRecord(model, y0), horizon: 50, samples: 11 },
              { wallTimeMs: 100 },
            );
            for (const v of Object.values(r.series).flat())
              expect(Number.isFinite(v) && v >= 0).toBe(true);
          } catch (e) {
            expect(e).toBeInstanceOf(IntegrationError);
          }
        },
      ),
      { numRuns: 100, seed: 17 },
    );
  });

  it('a level started at zero stays at zero without stocking (invariance)', () => {
    fc.assert(
      fc.property(arbitraryChain(), (model) => {
        const top = model.levels.length - 1;
        const stocked = (model.stocking ?? []).some((s) => s.level === model.levels[top]!.id);
        fc.pre(!stocked);
        const y0 = levelScales(model).map((s, i) => (i === top ? 0 : s * 0.5));
        const r = project({ model, initial: stateRecord(model, y0), horizon: 50, samples: 6 });
        expect(r.series[model.levels[top]!.id]!.every((v) => v === 0)).toBe(true);
      }),
      { numRuns: 60, seed: 3 },
    );
  });

  it('equilibria of random chains are roots: small residual, finite eigenvalues', () => {
    fc.assert(
      fc.property(arbitraryChain(), (model) => {
        const k = compileChain(model);
        const f = new Float64Array(model.levels.length);
        const S = levelScales(model);
        const r = model.levels[0].growthRate;
        for (const eq of findEquilibria(model)) {
          k.rhs(0, Float64Array.from(Object.values(eq.state)), f);
          f.forEach((v, i) =>
            expect(Math.abs(v)).toBeLessThan(
              1e-9 * r * Math.max(S[i]!, Math.abs(Object.values(eq.state)[i]!)),
            ),
          );
          expect(eq.eigenvalues).toHaveLength(model.levels.length);
          for (const v of eq.eigenvalues)
            expect(Number.isFinite(v.re) && Number.isFinite(v.im)).toBe(true);
        }
        expect(findEquilibria(model).some((q) => q.feasible)).toBe(true);
      }),
      { numRuns: 100, seed: 11 },
    );
  });

  it('invalid inputs always give pointers, never an untyped throw', () => {
    const preset = CHAIN_PRESETS[0]!;
    const valid = { model: preset.model, initial: preset.initial, horizon: 10 };
    const badValue = fc.oneof(
      fc.constantFrom(NaN, Infinity, -Infinity, -1, 0, 1e300, '', 'x', null, [], {}, true),
      fc.anything(),
    );
    // A random leaf of a valid body replaced by a random (mostly bad) value.
    const paths: (string | number)[][] = [];
    const walk = (node: unknown, path: (string | number)[]) => {
      if (node !== null && typeof node === 'object') {
        for (const [k, v] of Object.entries(node))
          walk(v, [...path, Array.isArray(node) ? Number(k) : k]);
      } else paths.push(path);
    };
    walk(valid, []);
    fc.assert(
      fc.property(fc.constantFrom(...paths), badValue, (path, value) => {
        const body = structuredClone(valid) as Record<string | number, unknown>;
        let node = body;
        for (const k of path.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
        node[path[path.length - 1]!] = value;
        const checked = validateProjectionRequest(body);
        if (!checked.ok) {
          expect(checked.errors.length).toBeGreaterThan(0);
          for (const e of checked.errors) {
            expect(e.pointer === '' || e.pointer.startsWith('/')).toBe(true);
            expect(e.message.length).toBeGreaterThan(0);
          }
        }
        try {
          project(body, { wallTimeMs: 50, maxSteps: 5000 });
        } catch (e) {
          expect(e instanceof ModelValidationError || e instanceof IntegrationError).toBe(true);
        }
      }),
      { numRuns: 400, seed: 5 },
    );
  });

  it('arbitrary junk as a body gives a ModelValidationError', () => {
    fc.assert(
      fc.property(fc.anything(), (junk) => {
        expect(() => project(junk)).toThrow(ModelValidationError);
      }),
      { numRuns: 300, seed: 9 },
    );
  });
});

describe('presets', () => {
  it.each(CHAIN_PRESETS.map((p) => [p.id, p] as const))(
    '%s validates, projects and says whether it is invented',
    (_id, p) => {
      expect(typeof p.invented).toBe('boolean');
      if (p.invented) expect(p.title).toContain('(invented)');
      const r = project({ model: p.model, initial: p.initial, horizon: 2000, samples: 2001 });
      const top = p.model.levels[p.model.levels.length - 1]!.id;
      const tail = r.series[top]!.slice(1000);
      const spread = (Math.max(...tail) - Math.min(...tail)) / Math.max(...tail);
      if (p.behaviour === 'settles') expect(spread).toBeLessThan(1e-3);
      else expect(spread).toBeGreaterThan(0.05);
      const feasibleStable = findEquilibria(p.model).filter((q) => q.feasible && q.stable);
      expect(feasibleStable.length > 0).toBe(p.behaviour === 'settles');
    },
  );
});
