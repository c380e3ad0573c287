import { LAKE_DEMO, type ChainModel } from '@tropline/core';
import { applyParameters, fieldProblem, parameterGroups } from './parameter-form-schema';

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

describe('fieldProblem', () => {
  const field = parameterGroups(LAKE_DEMO.model)[0]!.fields[1]!;

  it('accepts a value in range', () => {
    expect(fieldProblem(field, 50, 'en')).toBeNull();
  });

  it('names the limit with its unit, in the locale', () => {
    expect(fieldProblem(field, 81, 'en')).toBe('Must be at most 80 g C m⁻².');
    expect(fieldProblem({ ...field, min: 0.5 }, 0.1, 'de')).toBe('Must be at least 0,5 g C m⁻².');
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
