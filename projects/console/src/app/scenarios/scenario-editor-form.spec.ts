import { HttpErrorResponse } from '@angular/common/http';
import { UPLAND_DEMO, validateScenarioContent } from '@tropline/core';
import { parameterGroups } from '@tropline/widgets';
import { problemText } from '../problem/problem-text';
import {
  editedBody,
  editingBounds,
  editorValues,
  editProblems,
  fieldId,
  fieldTarget,
  parameterFields,
} from './scenario-editor-form';
import type { ScenarioContent } from './scenario-types';

const content: ScenarioContent = {
  name: 'Hobcairn Moor, wolf return',
  description: 'Invented upland.',
  location: 'Hobcairn Moor (invented)',
  model: UPLAND_DEMO.model,
  initial: UPLAND_DEMO.initial,
  horizon: 100,
  publicParameters: [{ pointer: '/levels/1/mortality', min: 0.2, max: 0.5 }],
};

describe('scenario editor form', () => {
  it('saves the version unchanged when nothing but the note is filled in', () => {
    const values = { ...editorValues(content), changeNote: '  Checked the values  ' };
    const body = editedBody(content, content.model, values, 3);
    expect(body.changeNote).toBe('Checked the values');
    expect(body.baseVersion).toBe(3);
    expect(body.publicParameters).toEqual(content.publicParameters);
    const { changeNote: _n, baseVersion: _b, ...saved } = body;
    // The contract's own check (the server runs the same) accepts it and reads back the input.
    const checked = validateScenarioContent(saved);
    expect(checked.ok).toBe(true);
    expect(checked.ok && checked.value.model).toEqual(content.model);
    expect(editProblems(body)).toEqual([]);
  });

  it('applies level names, units and starts from the form, keeping the ids', () => {
    const values = editorValues(content);
    const edited = {
      ...values,
      changeNote: 'Renamed',
      levels: values.levels.map((l, i) =>
        i === 2 ? { name: ' Grey wolf (north ridge) ', unit: 'packs km^-2', initial: 0.05 } : l,
      ),
    };
    const body = editedBody(content, content.model, edited, 1);
    expect(body.model.levels[2]).toMatchObject({
      id: 'wolves',
      name: 'Grey wolf (north ridge)',
      unit: 'packs km^-2',
    });
    expect(body.initial).toEqual({ heather: 300, deer: 8, wolves: 0.05 });
  });

  it('names each problem by the pointer the server would use', () => {
    const values = editorValues(content);
    const bad = {
      ...values,
      horizon: 5000,
      levels: values.levels.map((l, i) => (i === 1 ? { ...l, initial: -2 } : l)),
    };
    const pointers = editProblems(editedBody(content, content.model, bad, 1)).map((p) => p.pointer);
    expect(pointers).toContain('/changeNote');
    expect(pointers).toContain('/horizon');
    const negative = { ...values, changeNote: 'x', levels: bad.levels };
    expect(editProblems(editedBody(content, content.model, negative, 1))[0]?.pointer).toBe(
      '/initial/deer',
    );
  });

  it('maps pointers onto the form: text fields, level fields and parameter-form fields', () => {
    const m = content.model;
    expect(fieldTarget('/horizon', m)).toMatchObject({ kind: 'field', id: fieldId.horizon });
    expect(fieldTarget('/changeNote', m)).toMatchObject({ id: fieldId.changeNote });
    expect(fieldTarget('/initial/deer', m)).toMatchObject({ id: fieldId.initial(1) });
    expect(fieldTarget('/model/levels/2/name', m)).toMatchObject({ id: fieldId.levelName(2) });
    expect(fieldTarget('/model/levels/0/unit', m)).toMatchObject({ id: fieldId.levelUnit(0) });
    // The parameter form lists fields level by level; the index is the field's place there.
    const order = parameterGroups(m).flatMap((g) => g.fields.map((f) => f.pointer));
    const target = fieldTarget('/model/levels/1/mortality', m);
    expect(target).toMatchObject({
      kind: 'parameter',
      index: order.indexOf('/levels/1/mortality'),
    });
    expect(target.label).toMatch(/^Red deer \(Cervus elaphus\): /);
    expect(fieldTarget('/baseVersion', m)).toEqual({ kind: 'form', label: '' });
  });

  it('puts a server problem document back onto the field it names', () => {
    const err = new HttpErrorResponse({
      status: 400,
      error: {
        type: 'https://tropline.dev/problems/validation',
        title: 'The request is not valid',
        status: 400,
        errors: [{ pointer: '/model/levels/0/growthRate', message: 'must be greater than zero' }],
      },
    });
    const [field] = problemText(err, 'save').fields;
    expect(fieldTarget(field!.pointer, content.model)).toMatchObject({
      kind: 'parameter',
      index: 0,
    });
  });

  it('lets the parameter form go to zero only where the contract allows zero', () => {
    const bounds = editingBounds(content.model);
    const of = (pointer: string) => bounds.find((b) => b.pointer === pointer);
    expect(bounds.length).toBe(parameterFields(content.model).length);
    // Capacity must stay above zero (chain-model schema); mortality may be zero.
    expect(of('/levels/0/carryingCapacity')).toEqual({
      pointer: '/levels/0/carryingCapacity',
      min: 5,
      max: 5000,
    });
    expect(of('/levels/1/mortality')).toEqual({ pointer: '/levels/1/mortality', min: 0, max: 3 });
  });
});
