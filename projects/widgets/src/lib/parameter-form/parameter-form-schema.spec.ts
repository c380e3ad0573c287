import { LAKE_DEMO, type ChainModel } from '@tropline/core';
import {
  applyParameters,
  checkParameters,
  fieldErrorMessages,
  fieldProblem,
  parameterFieldId,
  parameterGroups,
} from './parameter-form-schema';

const harvested: ChainModel = {
  ...LAKE_DEMO.model,
  harvest: [{ level: 'perch', kind: 'effort', rate: 0.002 }],
};

describe('parameterGroups', () => {
  it('groups every parameter by level with ecological labels and units', () => {
    const groups = parameterGroups(LAKE_DEMO.model);
    expect(groups.map((g) => g.id)).toEqual(['algae', 'daphnia', 'perch']);
    expect(groups[0]!.legend).toBe('Green algae (Scenedesmus spp.) — producer');
    expect(groups[1]!.legend).toMatch(/— grazer$/);
    expect(groups[2]!.legend).toMatch(/— top predator$/);
    const daphnia = groups[1]!.fields;
    expect(daphnia.map((f) => f.label)).toEqual([
      'Attack rate a',
      'Handling time h',
      'Conversion efficiency e',
      'Mortality m',
    ]);
    expect(daphnia.map((f) => f.unit)).toEqual([
      'per (g C m⁻²) per week',
      'week',
      'g C m⁻² per g C m⁻²',
      'per week',
    ]);
    expect(groups[0]!.fields[1]).toMatchObject({ unit: 'g C m⁻²', value: 40, min: 0, max: 80 });
  });

  it('puts harvest with the level it takes from', () => {
    const perch = parameterGroups(harvested)[2]!;
    expect(perch.fields.at(-1)).toMatchObject({
      pointer: '/harvest/0/rate',
      label: 'Harvest effort F',
      unit: 'per week',
    });
  });

  it('lets the public change only what a published scenario allows, within its range', () => {
    const groups = parameterGroups(LAKE_DEMO.model, [
      { pointer: '/levels/0/carryingCapacity', min: 20, max: 60, label: 'Nutrient load (as K)' },
      { pointer: '/levels/2/mortality', min: 0, max: 1, editable: false },
    ]);
    const fields = groups.flatMap((g) => g.fields);
    const editable = fields.filter((f) => f.editable);
    expect(editable.map((f) => f.pointer)).toEqual(['/levels/0/carryingCapacity']);
    expect(editable[0]).toMatchObject({ min: 20, max: 60, label: 'Nutrient load (as K)' });
    expect(editable[0]!.step).toBeCloseTo(0.4);
  });
});

describe('bounds from the model contract', () => {
  // The chain-model schema: growth rate, capacity, attack rate and efficiency must be > 0;
  // handling time, mortality and harvest may be 0.
  const fields = parameterGroups(harvested).flatMap((g) => g.fields);
  const at = (pointer: string) => fields.find((f) => f.pointer === pointer)!;

  it('gives a parameter that must be above zero an exclusive lower bound at zero', () => {
    expect(at('/levels/0/growthRate')).toMatchObject({ min: 0, minExclusive: true, max: 4 });
    expect(at('/levels/0/growthRate').sliderMin).toBeCloseTo(0.04);
    expect(fieldProblem(at('/levels/0/growthRate'), 0, 'en')).toBe(
      'Must be greater than 0 per week.',
    );
    expect(fieldProblem(at('/levels/0/growthRate'), 1e-9, 'en')).toBeNull();
  });

  it('lets a parameter that may be zero go to zero', () => {
    for (const p of ['/levels/1/handlingTime', '/levels/2/mortality', '/harvest/0/rate']) {
      expect(at(p)).toMatchObject({ min: 0, minExclusive: false });
      expect(at(p).sliderMin).toBe(0);
    }
  });

  it('holds a publisher range to the contract: a minimum of 0 becomes "above 0"', () => {
    const [algae] = parameterGroups(LAKE_DEMO.model, [
      { pointer: '/levels/0/growthRate', min: 0, max: 3 },
    ]);
    expect(algae!.fields[0]).toMatchObject({ min: 0, minExclusive: true, max: 3 });
    const [raised] = parameterGroups(LAKE_DEMO.model, [
      { pointer: '/levels/0/growthRate', min: 1, max: 3 },
    ]);
    expect(raised!.fields[0]).toMatchObject({ min: 1, minExclusive: false, sliderMin: 1 });
  });
});

describe('checkParameters', () => {
  it("returns the contract's complaint instead of throwing for a value the model refuses", () => {
    const fields = parameterGroups(LAKE_DEMO.model).flatMap((g) => g.fields);
    const values = Object.fromEntries(fields.map((f) => [f.key, f.value]));
    const r = fields.find((f) => f.pointer === '/levels/0/growthRate')!;
    expect(checkParameters(LAKE_DEMO.model, fields, { ...values, [r.key]: 0 })).toEqual({
      ok: false,
      issues: [
        { pointer: '/levels/0/growthRate', message: 'growthRate must be greater than zero' },
      ],
    });
    const ok = checkParameters(LAKE_DEMO.model, fields, { ...values, [r.key]: 1.5 });
    expect(ok.ok && ok.model.levels[0]).toMatchObject({ growthRate: 1.5 });
  });
});

describe("field ids and the server's field errors", () => {
  it('derives a stable id from the pointer', () => {
    expect(parameterFieldId('/levels/1/handlingTime')).toBe('tropline-param-levels-1-handlingTime');
    expect(parameterFieldId('/harvest/0/rate', 'lake')).toBe('lake-harvest-0-rate');
  });

  it('puts an RFC 9457 errors[] entry on the field its pointer names, with or without /model', () => {
    const fields = parameterGroups(LAKE_DEMO.model).flatMap((g) => g.fields);
    const key = (p: string) => fields.find((f) => f.pointer === p)!.key;
    const messages = fieldErrorMessages(
      [
        { pointer: '/model/levels/0/growthRate', message: 'growthRate must be greater than zero' },
        { pointer: '/levels/1/mortality', message: 'outside the published range' },
        { pointer: '/horizon', message: 'must be at most 2000' },
      ],
      fields,
      '/model',
    );
    expect(messages).toEqual({
      [key('/levels/0/growthRate')]: 'Must be greater than zero',
      [key('/levels/1/mortality')]: 'Outside the published range',
    });
  });
});

describe('fieldProblem', () => {
  const field = parameterGroups(LAKE_DEMO.model)[0]!.fields[1]!;

  it('accepts a value in range', () => {
    expect(fieldProblem(field, 50, 'en')).toBeNull();
  });

  it('names the limit with its unit, in the locale', () => {
    expect(fieldProblem(field, 81, 'en')).toBe('Must be at most 80 g C m⁻².');
    expect(fieldProblem({ ...field, min: 0.5, minExclusive: false }, 0.1, 'de')).toBe(
      'Must be at least 0,5 g C m⁻².',
    );
  });

  it('asks for a number when the field is empty', () => {
    expect(fieldProblem(field, null, 'en')).toBe('Enter a number.');
  });
});

describe('applyParameters', () => {
  it('returns a new model with the changed values and leaves the original alone', () => {
    const fields = parameterGroups(LAKE_DEMO.model).flatMap((g) => g.fields);
    const values = Object.fromEntries(fields.map((f) => [f.key, f.value]));
    const k = fields.find((f) => f.pointer === '/levels/0/carryingCapacity')!;
    const next = applyParameters(LAKE_DEMO.model, fields, { ...values, [k.key]: 55 });
    expect(next.levels[0]).toMatchObject({ carryingCapacity: 55 });
    expect(LAKE_DEMO.model.levels[0]).toMatchObject({ carryingCapacity: 40 });
  });
});
