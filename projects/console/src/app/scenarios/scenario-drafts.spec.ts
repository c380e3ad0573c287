import { CHAIN_PRESETS, validateModel } from '@tropline/core';
import {
  defaultRange,
  fitRanges,
  levelId,
  presetDraft,
  sameRanges,
  scratchDraft,
  tunableParameters,
  withPublicRanges,
} from './scenario-drafts';

const moor = CHAIN_PRESETS.find((p) => p.id === 'hobcairn-moor-demo')!;

describe('scenario drafts', () => {
  it('starts a scenario from a preset with its model and start', () => {
    const draft = presetDraft(moor, '  Hobcairn Moor, 2027 culls ');
    expect(draft.name).toBe('Hobcairn Moor, 2027 culls');
    expect(draft.model).toBe(moor.model);
    expect(draft.initial).toEqual({ heather: 300, deer: 8, wolves: 0.02 });
    expect(draft.changeNote).toContain(moor.title);
    expect(presetDraft(moor, ' ').name).toBe(moor.title);
  });

  it('builds a valid two-level model from scratch, with ids from the names', () => {
    const draft = scratchDraft({
      name: 'Sedge and voles',
      timeUnit: 'year',
      producerName: 'Tussock sedge',
      producerUnit: 't km^-2',
      consumerName: 'Field vole',
      consumerUnit: 'animals ha^-1',
    });
    expect(validateModel(draft.model).ok).toBe(true);
    expect(Object.keys(draft.initial)).toEqual(['tussock-sedge', 'field-vole']);
    expect(levelId('42 things', 'producer')).toBe('producer');
    const same = scratchDraft({
      name: 'x',
      timeUnit: 'year',
      producerName: 'Grass',
      producerUnit: 'u',
      consumerName: 'Grass',
      consumerUnit: 'u',
    });
    expect(same.model.levels.map((l) => l.id)).toEqual(['grass', 'grass-2']);
  });

  it('lists the tunable parameters with readable labels', () => {
    const t = tunableParameters(moor.model);
    expect(t[0]).toEqual({
      pointer: '/levels/0/growthRate',
      label: 'Heather (Calluna vulgaris): growth rate',
      value: 0.8,
    });
    expect(t.map((p) => p.pointer)).toContain('/levels/2/mortality');
  });

  it('gives ranges of half to double, efficiency at most 1', () => {
    expect(defaultRange({ pointer: '/levels/1/mortality', value: 0.3 })).toEqual({
      min: 0.15,
      max: 0.6,
    });
    expect(defaultRange({ pointer: '/levels/1/efficiency', value: 0.8 })).toEqual({
      min: 0.4,
      max: 1,
    });
    expect(fitRanges(moor.model, ['/levels/1/mortality'])).toEqual([
      { pointer: '/levels/1/mortality', min: 0.15, max: 0.6 },
    ]);
  });

  it('compares public ranges regardless of order and saves new ones on the version', () => {
    const a = { pointer: '/levels/1/mortality', min: 0.1, max: 0.5 };
    const b = { pointer: '/levels/2/mortality', min: 0.1, max: 0.4 };
    expect(sameRanges([a, b], [b, a])).toBe(true);
    expect(sameRanges([a], [])).toBe(false);
    expect(sameRanges(undefined, [])).toBe(true);
    const body = withPublicRanges(presetDraft(moor, 'm'), [a], 3);
    expect(body).toMatchObject({ publicParameters: [a], baseVersion: 3 });
    expect(body.changeNote).toBe('Public ranges for 1 parameter');
  });
});
