import {
  MAX_SCENARIO_HORIZON,
  parameterPointers,
  getParameter,
  validateScenarioContent,
  type ChainModel,
} from '@tropline/core';
import { parameterGroups, type ParameterBounds } from '@tropline/widgets';
import type { FieldProblem } from '../problem/problem-text';
import type { ScenarioContent, ScenarioSaveBody } from './scenario-types';

/** What the edit form holds apart from the model's parameters (the parameter form has those). */
export interface EditorValues {
  readonly name: string;
  readonly description: string;
  readonly location: string;
  readonly horizon: number | null;
  readonly levels: readonly {
    readonly name: string;
    readonly unit: string;
    readonly initial: number | null;
  }[];
  readonly changeNote: string;
}

/** The longest change note the server keeps. */
export const MAX_CHANGE_NOTE = 500;

/** The form's starting values: the version as saved, with an empty change note. */
export function editorValues(content: ScenarioContent): EditorValues {
  return {
    name: content.name,
    description: content.description ?? '',
    location: content.location ?? '',
    horizon: content.horizon,
    levels: content.model.levels.map((l) => ({
      name: l.name,
      unit: l.unit,
      initial: content.initial[l.id] ?? null,
    })),
    changeNote: '',
  };
}

/**
 * The save of an edit: the parameters from the parameter form (`model`), level names and units,
 * the start and everything else from the form, the public ranges kept, based on `baseVersion`
 * (the server refuses the save if someone saved after it).
 */
export function editedBody(
  content: ScenarioContent,
  model: ChainModel,
  values: EditorValues,
  baseVersion: number,
): ScenarioSaveBody {
  const levels = model.levels.map((l, i) => ({
    ...l,
    name: values.levels[i]?.name.trim() ?? l.name,
    unit: values.levels[i]?.unit.trim() ?? l.unit,
  }));
  const description = values.description.trim();
  const location = values.location.trim();
  return {
    name: values.name.trim(),
    ...(description ? { description } : {}),
    ...(location ? { location } : {}),
    model: { ...model, levels } as ChainModel,
    initial: Object.fromEntries(
      model.levels.map((l, i) => [l.id, values.levels[i]?.initial as number]),
    ),
    horizon: values.horizon as number,
    ...(content.publicParameters?.length ? { publicParameters: content.publicParameters } : {}),
    changeNote: values.changeNote.trim(),
    baseVersion,
  };
}

/**
 * Every problem of a save before it is sent, with the pointers the server would use: the
 * contract's own validation of scenario content (the server runs the same) plus the change
 * note's rule.
 */
export function editProblems(body: ScenarioSaveBody): FieldProblem[] {
  const { changeNote, baseVersion: _base, ...content } = body;
  const problems: FieldProblem[] = [];
  if (!changeNote.trim() || changeNote.length > MAX_CHANGE_NOTE) {
    problems.push({
      pointer: '/changeNote',
      message: `Say what changed and why, in 1 to ${MAX_CHANGE_NOTE} characters.`,
    });
  }
  if (!(typeof body.horizon === 'number' && Number.isFinite(body.horizon))) {
    problems.push({ pointer: '/horizon', message: 'Enter the horizon as a number.' });
  }
  const checked = validateScenarioContent(content);
  if (!checked.ok)
    problems.push(...checked.errors.map(({ pointer, message }) => ({ pointer, message })));
  return problems;
}

/** Where on the form a pointer of a save lands. */
export type FieldTarget =
  | { readonly kind: 'field'; readonly id: string; readonly label: string }
  | { readonly kind: 'parameter'; readonly pointer: string; readonly label: string }
  | { readonly kind: 'form'; readonly label: '' };

/** The element id of a form field (stable, so messages can link to it). */
export const fieldId = {
  name: 'tc-edit-name',
  description: 'tc-edit-description',
  location: 'tc-edit-location',
  horizon: 'tc-edit-horizon',
  changeNote: 'tc-edit-note',
  levelName: (i: number) => `tc-edit-level-${i}-name`,
  levelUnit: (i: number) => `tc-edit-level-${i}-unit`,
  initial: (i: number) => `tc-edit-level-${i}-initial`,
} as const;

/**
 * Maps a pointer of the save body (from the contract check or the server's problem) onto the
 * form field that holds it: the text fields, a level's name, unit or start, or one field of the
 * parameter form (by the parameter's pointer into the model, which gives that field's id).
 * Anything else belongs to the form as a whole.
 */
export function fieldTarget(pointer: string, model: ChainModel): FieldTarget {
  const levelName = (i: number) => model.levels[i]?.name ?? `level ${i + 1}`;
  const simple: Record<string, [string, string]> = {
    '/name': [fieldId.name, 'Scenario name'],
    '/description': [fieldId.description, 'Description'],
    '/location': [fieldId.location, 'Location'],
    '/horizon': [fieldId.horizon, 'Horizon'],
    '/changeNote': [fieldId.changeNote, 'Change note'],
  };
  const hit = simple[pointer];
  if (hit) return { kind: 'field', id: hit[0], label: hit[1] };
  const initial = /^\/initial\/(.+)$/.exec(pointer);
  if (initial) {
    const i = model.levels.findIndex((l) => l.id === initial[1]);
    if (i >= 0) return { kind: 'field', id: fieldId.initial(i), label: `Start: ${levelName(i)}` };
  }
  const text = /^\/model\/levels\/(\d+)\/(name|unit)$/.exec(pointer);
  if (text) {
    const i = Number(text[1]);
    return text[2] === 'name'
      ? { kind: 'field', id: fieldId.levelName(i), label: `Name of level ${i + 1}` }
      : { kind: 'field', id: fieldId.levelUnit(i), label: `Unit of ${levelName(i)}` };
  }
  if (pointer.startsWith('/model/')) {
    const field = parameterFields(model).find((f) => f.pointer === pointer.slice('/model'.length));
    if (field) return { kind: 'parameter', pointer: field.pointer, label: field.label };
  }
  return { kind: 'form', label: '' };
}

/**
 * The parameter form's fields in the order it shows them (grouped by level, harvest and
 * stocking with their level), each labelled with its level: "Red deer: Attack rate".
 */
export function parameterFields(model: ChainModel): { pointer: string; label: string }[] {
  return parameterGroups(model).flatMap((g) =>
    g.fields.map((f) => ({ pointer: f.pointer, label: `${g.legend.split(' — ')[0]}: ${f.label}` })),
  );
}

/**
 * How far the analyst may move each parameter in the parameter form: from zero up to ten times
 * the saved value (1 for a parameter now at zero). The form itself keeps a parameter the model
 * needs above zero (growth, capacity, attack rate, efficiency) above zero, from the contract.
 */
export function editingBounds(model: ChainModel): ParameterBounds[] {
  return parameterPointers(model).map((pointer) => {
    const value = getParameter(model, pointer);
    return { pointer, min: 0, max: value > 0 ? Number((value * 10).toPrecision(3)) : 1 };
  });
}

/** The horizon's allowed range, as the form's hint says it. */
export const HORIZON_RANGE = { min: 0, max: MAX_SCENARIO_HORIZON } as const;
