import {
  type ChainModel,
  ENGINE_LIMITS,
  getParameter,
  ModelValidationError,
  parameterPointers,
  parsePointer,
  type ValidationIssue,
  withParameter,
} from '@tropline/core/contract';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';

/**
 * What a publisher allows the public to do with one parameter. A published scenario lists these;
 * a parameter it does not list stays fixed at the published value.
 */
export interface ParameterBounds {
  /** JSON Pointer into the model, e.g. `/levels/1/handlingTime`. */
  readonly pointer: string;
  /** Lowest value allowed. */
  readonly min: number;
  /** Highest value allowed. */
  readonly max: number;
  /** Slider step; default a hundredth of the range. */
  readonly step?: number;
  /** Label in the publisher's words, replacing the generic one. */
  readonly label?: string;
  /** Whether the public may change it (default true; false shows it fixed). */
  readonly editable?: boolean;
}

/** One field of the form. */
export interface ParameterField {
  /** JSON Pointer of the parameter. */
  readonly pointer: string;
  /** Form control name (pointers are not valid names). */
  readonly key: string;
  /** Label, e.g. "Handling time h". */
  readonly label: string;
  /** Unit as shown, e.g. "week" or "g C m⁻² per week". */
  readonly unit: string;
  /** Published (reset) value. */
  readonly value: number;
  /** Lowest value allowed, or, when `minExclusive`, the bound a value must exceed. */
  readonly min: number;
  /** Whether `min` itself is refused (the model needs the value above it, e.g. a growth rate). */
  readonly minExclusive: boolean;
  /** Highest value allowed. */
  readonly max: number;
  /** Slider step. */
  readonly step: number;
  /** The slider's lowest position: `min`, or one step above it when `min` is refused. */
  readonly sliderMin: number;
  /** Whether the reader may change it. */
  readonly editable: boolean;
}

/** The fields of one level, producer first. */
export interface ParameterGroup {
  /** Level id. */
  readonly id: string;
  /** Legend, e.g. "Water flea (Daphnia pulex) — grazer". */
  readonly legend: string;
  /** The level's fields. */
  readonly fields: readonly ParameterField[];
}

/** Rounds a step to one significant digit so slider values stay readable. */
function niceStep(range: number): number {
  if (!(range > 0)) return 1;
  const raw = range / 100;
  const p = 10 ** Math.floor(Math.log10(raw));
  return Math.round(raw / p) * p;
}

function unitOf(model: ChainModel, tokens: string[], strings: TroplineStrings): string {
  const t = model.timeUnit;
  const [section, index, name] = tokens;
  const levelIndex =
    section === 'levels'
      ? Number(index)
      : model.levels.findIndex((l) => l.id === model[section as 'harvest']?.[Number(index)]?.level);
  const level = model.levels[levelIndex];
  const prey = model.levels[levelIndex - 1];
  const u = formatUnit(level?.unit ?? '');
  const pu = formatUnit(prey?.unit ?? '');
  switch (name) {
    case 'growthRate':
    case 'mortality':
    case 'rate':
      return strings.perTime(t);
    case 'carryingCapacity':
      return u;
    case 'attackRate':
      return strings.attackUnit(pu, t);
    case 'handlingTime':
      return t;
    case 'efficiency':
      return strings.efficiencyUnit(u, pu);
    case 'amount':
      return strings.amountUnit(u, t);
    default:
      return '';
  }
}

function levelOf(model: ChainModel, tokens: string[]): string | undefined {
  const [section, index] = tokens;
  if (section === 'levels') return model.levels[Number(index)]?.id;
  if (section === 'harvest' || section === 'stocking') {
    return model[section]?.[Number(index)]?.level;
  }
  return undefined;
}

/**
 * The lowest value the model contract allows for a parameter: every parameter is at least 0,
 * and some (growth and attack rates, capacity, efficiency) must be above it. Asked of the
 * contract itself (`withParameter` validates), so the form follows the schema if it changes.
 */
function contractFloor(model: ChainModel, pointer: string): { min: number; exclusive: boolean } {
  try {
    withParameter(model, pointer, 0);
    return { min: 0, exclusive: false };
  } catch (err) {
    const refused = err instanceof ModelValidationError;
    return { min: 0, exclusive: refused && err.errors.some((e) => e.pointer === pointer) };
  }
}

/**
 * The form's groups for a model: every numeric parameter, grouped by the level it belongs to
 * (harvest and stocking with their level), labelled with its ecological name and unit. Without
 * `bounds` every parameter is editable from 0 to twice its value; with `bounds` (a published
 * scenario) only the listed ones are, within the publisher's range, the rest shown fixed.
 * Either way a range never goes past what the model contract accepts: a parameter that must be
 * above zero gets an exclusive lower bound at zero (its slider starting one step above), and no
 * maximum exceeds the engine's largest parameter.
 */
export function parameterGroups(
  model: ChainModel,
  bounds?: readonly ParameterBounds[],
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): ParameterGroup[] {
  const byPointer = new Map((bounds ?? []).map((b) => [b.pointer, b]));
  const fields = new Map<string, ParameterField[]>();
  parameterPointers(model).forEach((pointer, i) => {
    const tokens = pointer.split('/').slice(1);
    const level = levelOf(model, tokens);
    const name = tokens[tokens.length - 1]!;
    if (!level) return;
    const value = getParameter(model, pointer);
    const bound = byPointer.get(pointer);
    const floor = contractFloor(model, pointer);
    const asked = bound?.min ?? floor.min;
    const min = Math.max(asked, floor.min);
    const minExclusive = floor.exclusive && min <= floor.min;
    const max = Math.min(
      bound?.max ?? (value > 0 ? value * 2 : 1),
      ENGINE_LIMITS.maxParameterMagnitude,
    );
    const step = bound?.step ?? niceStep(max - min);
    const field: ParameterField = {
      pointer,
      key: `p${i}`,
      label:
        bound?.label ??
        strings.parameterLabel[tokens[0] === 'levels' ? name : `${tokens[0]}.${name}`] ??
        name,
      unit: unitOf(model, tokens, strings),
      value,
      min,
      minExclusive,
      max,
      step,
      sliderMin: minExclusive ? Math.min(min + step, max) : min,
      editable: bounds ? !!bound && bound.editable !== false : true,
    };
    fields.set(level, [...(fields.get(level) ?? []), field]);
  });
  return model.levels.map((l, i) => ({
    id: l.id,
    legend: `${l.name} — ${strings.levelRole(i, model.levels.length)}`,
    fields: fields.get(l.id) ?? [],
  }));
}

/** A problem with one value, or null when it is acceptable. */
export function fieldProblem(
  field: ParameterField,
  value: number | null | undefined,
  locale: string,
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): string | null {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 6 });
  if (value === null || value === undefined || !Number.isFinite(value)) return strings.notANumber;
  if (field.minExclusive && value <= field.min) {
    return strings.mustExceed(fmt.format(field.min), field.unit);
  }
  if (value < field.min) return strings.tooLow(fmt.format(field.min), field.unit);
  if (value > field.max) return strings.tooHigh(fmt.format(field.max), field.unit);
  return null;
}

/** The model with the form's values applied (throws ModelValidationError if one is invalid). */
export function applyParameters(
  model: ChainModel,
  fields: readonly ParameterField[],
  values: Readonly<Record<string, number | null>>,
): ChainModel {
  return fields.reduce(
    (m, f) =>
      f.editable && values[f.key] !== f.value ? withParameter(m, f.pointer, values[f.key]!) : m,
    model,
  );
}

/** The outcome of applying the form's values: the new model, or the contract's complaints. */
export type ParameterCheck =
  | { readonly ok: true; readonly model: ChainModel }
  | { readonly ok: false; readonly issues: readonly ValidationIssue[] };

/**
 * Like {@link applyParameters}, but never throws for a value the model refuses: the refusal comes
 * back as the contract's issues (pointers into the model), so a form can show them and go on.
 */
export function checkParameters(
  model: ChainModel,
  fields: readonly ParameterField[],
  values: Readonly<Record<string, number | null>>,
): ParameterCheck {
  try {
    return { ok: true, model: applyParameters(model, fields, values) };
  } catch (err) {
    if (err instanceof ModelValidationError) return { ok: false, issues: err.errors };
    throw err;
  }
}

/** The prefix of the form's field ids unless the host gives another (`idPrefix`). */
export const PARAMETER_ID_PREFIX = 'tropline-param';

/**
 * The element id of a parameter's numeric field: the prefix and the pointer's tokens joined by
 * hyphens, e.g. `/levels/1/handlingTime` → `tropline-param-levels-1-handlingTime`. Stable, so a
 * host can link to a field (`href="#…"`) or find it in a test.
 */
export function parameterFieldId(pointer: string, prefix = PARAMETER_ID_PREFIX): string {
  const tokens = parsePointer(pointer) ?? [pointer];
  return [prefix, ...tokens.map((t) => t.replace(/[^A-Za-z0-9_-]/g, '_'))].join('-');
}

/**
 * The host's field errors (RFC 9457 `errors[]` of a problem document) that belong to a field,
 * as messages by field key. An error belongs to a field when its pointer is the parameter's
 * pointer into the model, or that pointer under `modelPointer` (where the model sits in the
 * request the errors answer: `/model` in Tropline's projection and scenario bodies).
 */
export function fieldErrorMessages(
  errors: readonly { readonly pointer: string; readonly message: string }[],
  fields: readonly ParameterField[],
  modelPointer: string,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const e of errors) {
    const field = fields.find(
      (f) => f.editable && (e.pointer === f.pointer || e.pointer === modelPointer + f.pointer),
    );
    if (field && !out[field.key]) out[field.key] = contractMessage(e);
  }
  return out;
}

/**
 * A contract message as it reads under its field: without the field's code name in front
 * ("growthRate must be greater than zero" → "Must be greater than zero").
 */
export function contractMessage(issue: { readonly pointer: string; readonly message: string }) {
  const name = issue.pointer.split('/').at(-1) ?? '';
  const rest =
    name && issue.message.startsWith(name + ' ')
      ? issue.message.slice(name.length + 1)
      : issue.message;
  return rest.charAt(0).toUpperCase() + rest.slice(1);
}
