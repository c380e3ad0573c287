import {
  type ChainModel,
  getParameter,
  parameterPointers,
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
  /** Lowest value allowed. */
  readonly min: number;
  /** Highest value allowed. */
  readonly max: number;
  /** Slider step. */
  readonly step: number;
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
 * The form's groups for a model: every numeric parameter, grouped by the level it belongs to
 * (harvest and stocking with their level), labelled with its ecological name and unit. Without
 * `bounds` every parameter is editable from 0 to twice its value; with `bounds` (a published
 * scenario) only the listed ones are, within the publisher's range, the rest shown fixed.
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
    const min = bound?.min ?? 0;
    const max = bound?.max ?? (value > 0 ? value * 2 : 1);
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
      max,
      step: bound?.step ?? niceStep(max - min),
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
