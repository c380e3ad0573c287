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
    // A parameter-form field by its pointer into the model (the form derives its id from it).
    const target = fieldTarget('/model/levels/1/mortality', m);
    expect(target).toMatchObject({ kind: 'parameter', pointer: '/levels/1/mortality' });
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
      pointer: '/levels/0/growthRate',
    });
  });

  it('lets the parameter form move every parameter from zero to ten times its value', () => {
    const bounds = editingBounds(content.model);
    expect(bounds.length).toBe(parameterFields(content.model).length);
    // The form holds the ones the contract needs above zero there itself (widgets' spec).
    expect(bounds.find((b) => b.pointer === '/levels/0/carryingCapacity')).toEqual({
      pointer: '/levels/0/carryingCapacity',
      min: 0,
      max: 5000,
    });
    const fields = parameterGroups(content.model, bounds).flatMap((g) => g.fields);
    expect(fields.find((f) => f.pointer === '/levels/0/growthRate')).toMatchObject({
      min: 0,
      minExclusive: true,
    });
    expect(fields.find((f) => f.pointer === '/levels/1/mortality')).toMatchObject({
      min: 0,
      minExclusive: false,
    });
  });
});
