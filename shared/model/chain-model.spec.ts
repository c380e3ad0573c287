import { describe, expect, it } from 'vitest';
import { HASTINGS_POWELL_BENCHMARK } from './presets';
import { validateModel } from './model-validation';
import {
  getParameter,
  parameterPointers,
  ParameterPointerError,
  withParameter,
} from './parameter-pointer';
import { initialVector, stateRecord } from './initial-vector';
import { ModelValidationError, formatPointer, parsePointer } from './validation-issue';
import { validateProjectionRequest } from '../contract/projection-request';
import { validateEquilibriaRequest } from '../contract/equilibria-contract';

// The API contract's example model (api-contract.md), kept verbatim.
const contractExample = {
  timeUnit: 'year',
  levels: [
    { id: 'algae', name: 'Littoral algae', unit: 'g C m^-2', growthRate: 1, carryingCapacity: 1 },
    {
      id: 'grazers',
      name: 'Grazing snails',
      unit: 'g C m^-2',
      attackRate: 5,
      handlingTime: 0.6,
      efficiency: 1,
      mortality: 0.4,
    },
    {
      id: 'fish',
      name: 'Pumpkinseed',
      unit: 'g C m^-2',
      attackRate: 0.1,
      handlingTime: 20,
      efficiency: 1,
      mortality: 0.01,
    },
  ],
  harvest: [{ level: 'fish', kind: 'effort', rate: 0.02 }],
};

function mutate(path: (string | number)[], value: unknown): unknown {
  const copy = structuredClone(contractExample) as Record<string, unknown>;
  let node: Record<string | number, unknown> = copy;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  const last = path[path.length - 1]!;
  if (value === undefined) delete node[last];
  else node[last] = value;
  return copy;
}

function pointersOf(input: unknown): string[] {
  const r = validateModel(input);
  if (r.ok) return [];
  return r.errors.map((e) => e.pointer);
}

describe('chain model schema', () => {
  it('accepts the API contract example exactly', () => {
    const r = validateModel(contractExample);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value).toEqual(contractExample);
  });

  it.each([
    ['negative growth rate', ['levels', 0, 'growthRate'], -1],
    ['zero carrying capacity', ['levels', 0, 'carryingCapacity'], 0],
    ['negative attack rate', ['levels', 1, 'attackRate'], -5],
    ['negative handling time', ['levels', 1, 'handlingTime'], -0.1],
    ['zero efficiency', ['levels', 2, 'efficiency'], 0],
    ['negative mortality', ['levels', 2, 'mortality'], -0.01],
    ['NaN', ['levels', 1, 'attackRate'], NaN],
    ['Infinity', ['levels', 1, 'mortality'], Infinity],
    ['-Infinity', ['levels', 0, 'growthRate'], -Infinity],
    ['a string for a number', ['levels', 1, 'handlingTime'], '0.6'],
    ['a missing field', ['levels', 1, 'efficiency'], undefined],
    ['an unknown response', ['levels', 2, 'response'], 'type4'],
    ['a bad id', ['levels', 0, 'id'], 'Algae Bed'],
    ['an empty name', ['levels', 0, 'name'], ''],
    ['a negative harvest rate', ['harvest', 0, 'rate'], -0.02],
    ['a harvest of an unknown level', ['harvest', 0, 'level'], 'trout'],
    ['an unknown harvest kind', ['harvest', 0, 'kind'], 'cull'],
    ['a missing time unit', ['timeUnit'], undefined],
  ])('points at %s', (_label, path, value) => {
    expect(pointersOf(mutate(path, value))).toContain(formatPointer(path));
  });

  it('points at an unknown field by its own pointer', () => {
    expect(pointersOf(mutate(['levels', 0, 'attackRate'], 5))).toEqual(['/levels/0/attackRate']);
  });

  it('points at a duplicate id', () => {
    // The harvest rule then names a level that no longer exists: reported too.
    expect(pointersOf(mutate(['levels', 2, 'id'], 'grazers'))).toEqual([
      '/levels/2/id',
      '/harvest/0/level',
    ]);
  });

  it('rejects too few and too many levels at /levels', () => {
    const one = { ...contractExample, harvest: [], levels: contractExample.levels.slice(0, 1) };
    expect(pointersOf(one)).toEqual(['/levels']);
    const extra = (k: number) => ({ ...contractExample.levels[2]!, id: `top-${k}` });
    const five = { ...contractExample, levels: [...contractExample.levels, extra(1), extra(2)] };
    expect(pointersOf(five)).toEqual(['/levels']);
    expect(pointersOf({ ...contractExample, levels: [] })).toEqual(['/levels/0']);
  });

  it('points at stocking of an unknown level', () => {
    expect(pointersOf({ ...contractExample, stocking: [{ level: 'pike', amount: 1 }] })).toEqual([
      '/stocking/0/level',
    ]);
  });

  it('gives the root pointer for a non-object', () => {
    expect(pointersOf(42)).toEqual(['']);
    expect(pointersOf(null)).toEqual(['']);
  });
});

describe('projection request validation (pointers relative to the body)', () => {
  const body = {
    model: contractExample,
    initial: { algae: 0.8, grazers: 0.2, fish: 9 },
    horizon: 100,
  };

  it('fills defaults', () => {
    const r = validateProjectionRequest(body);
    expect(r.ok && r.value.samples).toBe(201);
    expect(r.ok && r.value.tolerance).toBe(1e-8);
  });

  it.each([
    ['/model/levels/1/attackRate', { ...body, model: mutate(['levels', 1, 'attackRate'], -1) }],
    ['/initial/fish', { ...body, initial: { algae: 0.8, grazers: 0.2, fish: NaN } }],
    ['/initial/fish', { ...body, initial: { algae: 0.8, grazers: 0.2, fish: -1 } }],
    ['/initial/fish', { ...body, initial: { algae: 0.8, grazers: 0.2 } }],
    ['/initial/pike', { ...body, initial: { ...body.initial, pike: 1 } }],
    ['/initial/fish', { ...body, initial: { algae: 0.8, grazers: 0.2, fish: Infinity } }],
    ['/horizon', { ...body, horizon: 0 }],
    ['/horizon', { ...body, horizon: 1e9 }],
    ['/horizon', { ...body, horizon: undefined }],
    ['/samples', { ...body, samples: 1 }],
    ['/samples', { ...body, samples: 10.5 }],
    ['/samples', { ...body, samples: 1e7 }],
    ['/tolerance', { ...body, tolerance: 0 }],
    ['/tolerance', { ...body, tolerance: 0.5 }],
    ['/model', { ...body, model: undefined }],
    ['/extra', { ...body, extra: true }],
    ['', [body]],
  ])('points at %s', (pointer, input) => {
    const r = validateProjectionRequest(input);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.pointer)).toContain(pointer);
  });

  it('validates equilibria requests the same way', () => {
    expect(validateEquilibriaRequest({ model: contractExample }).ok).toBe(true);
    const bad = validateEquilibriaRequest({ model: mutate(['levels', 0, 'carryingCapacity'], 0) });
    expect(!bad.ok && bad.errors[0]!.pointer).toBe('/model/levels/0/carryingCapacity');
    const missing = validateEquilibriaRequest({});
    expect(!missing.ok && missing.errors[0]!.pointer).toBe('/model');
  });
});

describe('parameter pointers (RFC 6901)', () => {
  const model = HASTINGS_POWELL_BENCHMARK.model;

  it('reads and writes a parameter without touching the input', () => {
    expect(getParameter(model, '/levels/1/handlingTime')).toBe(0.6);
    const changed = withParameter(model, '/levels/1/handlingTime', 0.4);
    expect(getParameter(changed, '/levels/1/handlingTime')).toBe(0.4);
    expect(getParameter(model, '/levels/1/handlingTime')).toBe(0.6);
  });

  it.each([
    '/levels/9/attackRate',
    '/levels/1/nope',
    '/levels/1/id',
    'levels/1/attackRate',
    '',
    '/levels/01/attackRate',
    '/levels',
  ])('throws a typed error for %j', (p) => {
    expect(() => getParameter(model, p)).toThrow(ParameterPointerError);
  });

  it('rejects a value that makes the model invalid, with its pointer', () => {
    try {
      withParameter(model, '/levels/0/carryingCapacity', -1);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ModelValidationError);
      expect((e as ModelValidationError).errors[0]!.pointer).toBe('/levels/0/carryingCapacity');
    }
  });

  it('lists every numeric parameter', () => {
    expect(parameterPointers(model)).toContain('/levels/2/mortality');
    expect(parameterPointers(model)).toHaveLength(10);
  });

  it('escapes and unescapes tokens (RFC 6901 §3–4)', () => {
    expect(formatPointer(['a/b', 'm~n'])).toBe('/a~1b/m~0n');
    expect(parsePointer('/a~1b/m~0n')).toEqual(['a/b', 'm~n']);
    expect(parsePointer('/bad~2')).toBeUndefined();
  });
});

describe('initial states', () => {
  const model = HASTINGS_POWELL_BENCHMARK.model;
  it('maps ids to level order and back', () => {
    const y = initialVector(model, { z: 9, x: 0.8, y: 0.2 });
    expect([...y]).toEqual([0.8, 0.2, 9]);
    expect(stateRecord(model, y)).toEqual({ x: 0.8, y: 0.2, z: 9 });
  });
  it('throws ModelValidationError with /initial pointers', () => {
    expect(() => initialVector(model, { x: 1, y: 1 })).toThrow(ModelValidationError);
  });
});
