import { describe, expect, it } from 'vitest';
import { PROJECTION_CAUTIONS } from '../contract/cautions';
import { projectionResponseSchema } from '../contract/projection-response';
import { compileChain } from '../model/chain-kernel';
import { ModelValidationError } from '../model/validation-issue';
import { HASTINGS_POWELL_BENCHMARK as B } from '../model/presets';
import { integrateChain } from './integrate-chain';
import { IntegrationError } from './integration-error';
import { absoluteFloor, project, sampleTimes } from './project';

const body = { model: B.model, initial: B.initial, horizon: 100, samples: 11 };

function failure(fn: () => unknown): unknown {
  try {
    fn();
  } catch (e) {
    return e;
  }
  throw new Error('expected a throw');
}

describe('project', () => {
  it('answers the contract shape with evenly spaced times 0..horizon', () => {
    const r = project(body);
    expect(r.times).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);
    expect(Object.keys(r.series)).toEqual(['x', 'y', 'z']);
    expect(r.series.x![0]).toBe(0.8);
    expect(r.series.z).toHaveLength(11);
    expect(r.diagnostics.steps).toBeGreaterThan(0);
    expect(r.diagnostics.rhsEvaluations).toBeGreaterThan(r.diagnostics.steps);
    expect(r.diagnostics.accepted + r.diagnostics.rejected).toBeLessThanOrEqual(
      r.diagnostics.steps,
    );
    expect(r.cautions).toEqual(PROJECTION_CAUTIONS);
  });

  it('matches the response schema, and projects the contract example with its harvest', () => {
    expect(projectionResponseSchema.safeParse(project(body)).success).toBe(true);
    const harvested = {
      ...B.model,
      harvest: [{ level: 'z', kind: 'effort', rate: 0.02 }],
    };
    const r = project({ model: harvested, initial: B.initial, horizon: 500, samples: 6 });
    expect(r.series.z!.every((v) => Number.isFinite(v) && v >= 0)).toBe(true);
  });

  it('is deterministic bit for bit', () => {
    expect(project(body)).toEqual(project(body));
  });

  it('samples the dense output: the end sample equals a direct solve to the end', () => {
    const direct = integrateChain(compileChain(B.model), [0.8, 0.2, 9], {
      t1: 100,
      scales: [1, 1, 1],
      absoluteTolerance: absoluteFloor(1e-8, [1, 1, 1]),
    });
    const r = project(body);
    expect(r.series.z![10]).toBe(direct.y[2]); // same steps: sampling does not change them
  });

  it('throws ModelValidationError with pointers for bad input, never an untyped error', () => {
    const e = failure(() => project({ ...body, horizon: -1, initial: { x: 1 } }));
    expect(e).toBeInstanceOf(ModelValidationError);
    expect((e as ModelValidationError).errors.map((i) => i.pointer)).toEqual(
      expect.arrayContaining(['/horizon', '/initial/y', '/initial/z']),
    );
  });

  it('ends at the step budget with a typed error', () => {
    const e = failure(() => project({ ...body, horizon: 5000 }, { maxSteps: 50 }));
    expect(e).toBeInstanceOf(IntegrationError);
    expect((e as IntegrationError).code).toBe('step-limit');
  });

  it('ends at the wall-time budget with a typed error (fake clock)', () => {
    let clock = 0;
    const e = failure(() =>
      project({ ...body, horizon: 5000 }, { wallTimeMs: 100, now: () => (clock += 1) }),
    );
    expect(e).toBeInstanceOf(IntegrationError);
    expect((e as IntegrationError).code).toBe('time-limit');
  });

  it('names blow-up, non-finite and negative states, with the level', () => {
    const grow = {
      dimension: 1,
      rhs: (_t: number, y: Float64Array, d: Float64Array) => void (d[0] = y[0]! * y[0]!),
    };
    const blow = failure(() =>
      integrateChain(grow, [1], { t1: 2, ids: ['pike'] }),
    ) as IntegrationError;
    expect(blow).toBeInstanceOf(IntegrationError);
    expect(blow.code).toBe('blow-up');
    expect(blow.levelId).toBe('pike');
    const fall = {
      dimension: 1,
      rhs: (_t: number, _y: Float64Array, d: Float64Array) => void (d[0] = -1),
    };
    const neg = failure(() =>
      integrateChain(fall, [1], { t1: 2, ids: ['pike'] }),
    ) as IntegrationError;
    expect(neg.code).toBe('negative-level');
    expect(neg.message).toContain('pike');
    const nan = {
      dimension: 1,
      rhs: (t: number, _y: Float64Array, d: Float64Array) => void (d[0] = t > 1 ? NaN : 0),
    };
    const nf = failure(() =>
      integrateChain(nan, [1], { t1: 2, maxSteps: 1000 }),
    ) as IntegrationError;
    expect(nf).toBeInstanceOf(IntegrationError);
  });

  it('builds sample times whose last entry is exactly the horizon', () => {
    const t = sampleTimes(0.3, 7);
    expect(t[0]).toBe(0);
    expect(t[6]).toBe(0.3);
  });
});
