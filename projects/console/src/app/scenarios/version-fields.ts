import type { ChainModel } from '@tropline/core';
import { parameterFields } from './scenario-editor-form';
import type { ScenarioContent } from './scenario-types';

/** One difference as `GET /scenarios/{id}/comparison` lists it. */
export interface VersionChange {
  readonly pointer: string;
  readonly before?: unknown;
  readonly after?: unknown;
}

/** One row of the field-by-field comparison. */
export interface FieldRow {
  readonly pointer: string;
  /** What the field is, in words: "Red deer: Attack rate", "Start: Heather". */
  readonly label: string;
  readonly before: string;
  readonly after: string;
  /** How it differs; `same` when it does not. */
  readonly difference: 'same' | 'changed' | 'added' | 'removed';
}

/** Every leaf of a JSON value as pointer → value, in document order. */
function leaves(value: unknown, pointer = '', out = new Map<string, unknown>()) {
  if (Array.isArray(value)) value.forEach((v, i) => leaves(v, `${pointer}/${i}`, out));
  else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      leaves(v, `${pointer}/${k.replace(/~/g, '~0').replace(/\//g, '~1')}`, out);
    }
  } else out.set(pointer, value);
  return out;
}

const TOP: Readonly<Record<string, string>> = {
  '/name': 'Name',
  '/description': 'Description',
  '/location': 'Location',
  '/horizon': 'Horizon',
  '/model/timeUnit': 'Time unit',
};
const LEVEL_TEXT: Readonly<Record<string, string>> = {
  id: 'id',
  name: 'name',
  unit: 'unit',
  response: 'functional response',
};
const RANGE_FIELD: Readonly<Record<string, string>> = {
  pointer: 'parameter',
  min: 'lowest',
  max: 'highest',
  step: 'step',
  label: 'label',
};

/** A field of a version in words; the pointer itself when nothing better is known. */
export function fieldLabel(pointer: string, model: ChainModel): string {
  if (TOP[pointer]) return TOP[pointer];
  const level = /^\/model\/levels\/(\d+)\/(\w+)$/.exec(pointer);
  if (level && LEVEL_TEXT[level[2]!]) {
    return `Level ${Number(level[1]) + 1} ${LEVEL_TEXT[level[2]!]}`;
  }
  if (pointer.startsWith('/model/')) {
    const f = parameterFields(model).find((p) => `/model${p.pointer}` === pointer);
    if (f) return f.label;
  }
  const initial = /^\/initial\/(.+)$/.exec(pointer);
  if (initial) {
    const l = model.levels.find((x) => x.id === initial[1]);
    return `Start: ${l?.name ?? initial[1]}`;
  }
  const range = /^\/publicParameters\/(\d+)\/(\w+)$/.exec(pointer);
  if (range && RANGE_FIELD[range[2]!]) {
    return `Public range ${Number(range[1]) + 1}: ${RANGE_FIELD[range[2]!]}`;
  }
  return pointer;
}

/** A value as the table shows it: numbers to six significant digits, absent as a dash. */
export function shownValue(value: unknown, locale = 'en'): string {
  if (value === undefined || value === null) return '—';
  if (typeof value === 'number') {
    return new Intl.NumberFormat(locale, { maximumSignificantDigits: 6 }).format(value);
  }
  return typeof value === 'string' ? value : JSON.stringify(value);
}

/**
 * The rows comparing two versions field by field: every field either version has, in the later
 * version's order (fields only the earlier one had at the end), marked as the server's list of
 * changes says, so the table and the API never disagree about what differs.
 */
export function fieldRows(
  before: ScenarioContent,
  after: ScenarioContent,
  changes: readonly VersionChange[],
  locale = 'en',
): FieldRow[] {
  const a = leaves(before);
  const b = leaves(after);
  const changed = new Map(changes.map((c) => [c.pointer, c]));
  const pointers = [...new Set([...b.keys(), ...a.keys(), ...changed.keys()])];
  return pointers.map((pointer) => {
    const c = changed.get(pointer);
    const was = c ? c.before : a.get(pointer);
    const is = c ? c.after : b.get(pointer);
    const difference = !c
      ? 'same'
      : was === undefined
        ? 'added'
        : is === undefined
          ? 'removed'
          : 'changed';
    const model = pointer.startsWith('/model/') && !b.has(pointer) ? before.model : after.model;
    // A public range names its parameter by pointer; say which parameter it is.
    const named = /^\/publicParameters\/\d+\/pointer$/.test(pointer)
      ? (v: unknown, m: ChainModel) =>
          parameterFields(m).find((f) => f.pointer === v)?.label ?? shownValue(v, locale)
      : (v: unknown) => shownValue(v, locale);
    return {
      pointer,
      label: fieldLabel(pointer, model),
      before: named(was, before.model),
      after: named(is, after.model),
      difference,
    };
  });
}

/** Who saved a version, in words: a member by name, a key by id, the demo seed as such. */
export function authorName(author: string, members: ReadonlyMap<string, string>): string {
  if (author.startsWith('user:')) return members.get(author.slice(5)) ?? 'a former member';
  if (author.startsWith('key:')) return `API key ${author.slice(4)}`;
  return author === 'seed' ? 'the demo data' : author;
}
