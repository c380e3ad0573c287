import type { ChainModel, ChainPreset } from '@tropline/core';
import type {
  FitRange,
  PublicParameter,
  ScenarioContent,
  ScenarioSaveBody,
} from './scenario-types';

/** Parameters an analyst usually tunes, by field, with how they are named on screen. */
const TUNABLE: Readonly<Record<string, string>> = {
  growthRate: 'growth rate',
  carryingCapacity: 'carrying capacity',
  attackRate: 'attack rate',
  handlingTime: 'handling time',
  efficiency: 'conversion efficiency',
  mortality: 'mortality',
};

/** One tunable parameter of a model. */
export interface Tunable {
  readonly pointer: string;
  readonly label: string;
  readonly value: number;
}

/** The growth, feeding and mortality parameters of every level, producer first. */
export function tunableParameters(model: ChainModel): Tunable[] {
  return model.levels.flatMap((level, i) =>
    Object.entries(TUNABLE).flatMap(([field, what]) => {
      const value = (level as unknown as Record<string, unknown>)[field];
      return typeof value === 'number'
        ? [{ pointer: `/levels/${i}/${field}`, label: `${level.name}: ${what}`, value }]
        : [];
    }),
  );
}

/** Three significant digits: ranges people read and type. */
function round3(x: number): number {
  return Number(x.toPrecision(3));
}

/** A default range around a value: half to double (efficiency never above 1). */
export function defaultRange(t: Pick<Tunable, 'pointer' | 'value'>): { min: number; max: number } {
  const min = round3(t.value / 2);
  const max = round3(t.pointer.endsWith('/efficiency') ? Math.min(1, t.value * 2) : t.value * 2);
  return { min, max: max > min ? max : round3(min * 2) };
}

/** A first version from a preset: its model and start, a horizon of 100 time units. */
export function presetDraft(preset: ChainPreset, name: string): ScenarioSaveBody {
  return {
    name: name.trim() || preset.title,
    description: preset.description,
    model: preset.model,
    initial: { ...preset.initial },
    horizon: 100,
    changeNote: `Created from the preset "${preset.title}"`,
  };
}

/** What the from-scratch form asks for. */
export interface ScratchForm {
  readonly name: string;
  readonly timeUnit: string;
  readonly producerName: string;
  readonly producerUnit: string;
  readonly consumerName: string;
  readonly consumerUnit: string;
}

/** A lowercase slug for a level id, from its name (`Red deer` → `red-deer`). */
export function levelId(name: string, fallback: string): string {
  const slug = name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40);
  return /^[a-z]/.test(slug) ? slug : fallback;
}

/**
 * A two-level chain to start from: a logistic producer and one consumer with a type II
 * response, at round values that settle, so the first preview is calm and the analyst edits
 * from there.
 */
export function scratchDraft(f: ScratchForm): ScenarioSaveBody {
  const producer = levelId(f.producerName, 'producer');
  let consumer = levelId(f.consumerName, 'consumer');
  if (consumer === producer) consumer = `${consumer}-2`;
  const model: ChainModel = {
    timeUnit: f.timeUnit.trim(),
    levels: [
      {
        id: producer,
        name: f.producerName.trim(),
        unit: f.producerUnit.trim(),
        growthRate: 1,
        carryingCapacity: 100,
      },
      {
        id: consumer,
        name: f.consumerName.trim(),
        unit: f.consumerUnit.trim(),
        attackRate: 0.05,
        handlingTime: 0.1,
        efficiency: 0.3,
        mortality: 0.4,
      },
    ],
  } as ChainModel;
  return {
    name: f.name.trim(),
    model,
    initial: { [producer]: 50, [consumer]: 5 },
    horizon: 100,
    changeNote: 'Created from scratch',
  };
}

/** The public ranges a publication offers, in a stable order for comparing. */
export function sameRanges(
  a: readonly PublicParameter[] | undefined,
  b: readonly PublicParameter[] | undefined,
): boolean {
  const key = (p: readonly PublicParameter[] | undefined) =>
    JSON.stringify(
      [...(p ?? [])]
        .sort((x, y) => x.pointer.localeCompare(y.pointer))
        .map((x) => [x.pointer, x.min, x.max, x.label ?? '']),
    );
  return key(a) === key(b);
}

/** A save of `content` with other public ranges, based on `version`. */
export function withPublicRanges(
  content: ScenarioContent,
  ranges: readonly PublicParameter[],
  version: number,
): ScenarioSaveBody {
  return {
    ...content,
    publicParameters: ranges,
    changeNote: ranges.length
      ? `Public ranges for ${ranges.length} parameter${ranges.length === 1 ? '' : 's'}`
      : 'No public ranges: the public sees the scenario as published',
    baseVersion: version,
  };
}

/** Fit ranges for the chosen pointers, each the default range around its current value. */
export function fitRanges(model: ChainModel, pointers: readonly string[]): FitRange[] {
  return tunableParameters(model)
    .filter((t) => pointers.includes(t.pointer))
    .map((t) => ({ pointer: t.pointer, ...defaultRange(t) }));
}
