import { describe, expect, it } from 'vitest';
import { validateRegimeRequest, regimeResponseSchema } from './regime-contract';
import { validateRegimeMapRequest, sweepResultSchema } from './sweep-contract';
import { assessRegime } from '../regime/assess-regime';
import { benchmarkChain, BENCHMARK_INITIAL } from '../../tests/reference/analyses-benchmark-chain';

const base = { model: benchmarkChain(3), initial: BENCHMARK_INITIAL };
const pointers = (v: { ok: boolean; errors?: readonly { pointer: string }[] }) =>
  (v.errors ?? []).map((e) => e.pointer);

describe('regime requests', () => {
  it('accepts the contract body and fills no defaults it does not need', () => {
    const v = validateRegimeRequest({ ...base, transient: 1000, window: 1000 });
    expect(v.ok).toBe(true);
    if (v.ok) expect(v.value.transient).toBe(1000);
  });

  it.each([
    [{ transient: -1 }, '/transient'],
    [{ window: 200_000 }, '/window'],
    [{ exponents: 4 }, '/exponents'],
    [{ observe: 'otters' }, '/observe'],
    [{ extinction: { otters: 1 } }, '/extinction/otters'],
    [{ colour: 'red' }, '/colour'],
    [{ model: { ...benchmarkChain(3), levels: [] } }, '/model/levels/0'],
  ])('rejects %o with a pointer at %s', (over, pointer) => {
    const v = validateRegimeRequest({ ...base, ...over });
    expect(v.ok).toBe(false);
    expect(pointers(v as never)).toContain(pointer);
  });

  it('answers in the shape of the regime response schema', () => {
    const r = assessRegime(benchmarkChain(2.2), BENCHMARK_INITIAL, {
      transient: 2000,
      window: 2000,
    });
    expect(regimeResponseSchema.safeParse(r).success).toBe(true);
    expect(
      sweepResultSchema.safeParse({ points: [{ value: 1, maxima: [2], regime: 'cycle' }] }).success,
    ).toBe(true);
  });
});

describe('regime-map requests', () => {
  const axis = (parameter: string, from: number, to: number, steps: number) => ({
    parameter,
    from,
    to,
    steps,
  });
  const map = (over: object = {}) => ({
    ...base,
    x: axis('/levels/1/handlingTime', 0.4, 1.2, 3),
    y: axis('/levels/2/mortality', 0.01, 0.02, 3),
    transient: 100,
    window: 100,
    ...over,
  });
  it('accepts two parameter axes', () => {
    expect(validateRegimeMapRequest(map()).ok).toBe(true);
  });
  it.each([
    [{ x: axis('/levels/1/size', 0, 1, 3) }, '/x/parameter'],
    [{ y: axis('/levels/2/mortality', -1, 1, 3) }, '/y/from'],
    [{ x: axis('/levels/1/handlingTime', 0.4, 1, 201) }, '/x/steps'],
    [
      {
        x: axis('/levels/1/handlingTime', 0.4, 1, 200),
        y: axis('/levels/2/mortality', 0.01, 0.02, 51),
      },
      '/y/steps',
    ],
  ])('rejects %o with a pointer at %s', (over, pointer) => {
    const v = validateRegimeMapRequest(map(over));
    expect(v.ok).toBe(false);
    expect(pointers(v as never)).toContain(pointer);
  });
});
