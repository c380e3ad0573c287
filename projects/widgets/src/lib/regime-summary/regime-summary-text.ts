import type { ChainModel, Equilibrium } from '@tropline/core/contract';
import type { RegimeResponse } from '../api/analysis-types';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';

/** One labelled fact of the summary. */
export interface SummaryFact {
  /** What it is, e.g. "Predictability horizon". */
  readonly label: string;
  /** Its value in words and numbers. */
  readonly value: string;
}

/** One equilibrium as the summary lists it. */
export interface SummaryEquilibrium {
  /** The levels present, in words, e.g. "Green algae and Water flea". */
  readonly name: string;
  /** Every level's value with its unit. */
  readonly state: string;
  /** Whether it attracts nearby states. */
  readonly stable: boolean;
  /** Its class and what that means, e.g. "stable spiral: nearby states return …". */
  readonly stability: string;
}

/**
 * The engine's regime notes (`shared/regime/classify-regime.ts`) by how they begin, so they can be
 * said in the host's words; a note not listed is shown as the API wrote it.
 */
const NOTE_KINDS: readonly (readonly [string, 'dyingOut' | 'shortWindow' | 'transient'])[] = [
  ['a level still above its quasi-extinction threshold', 'dyingOut'],
  ['irregular maxima', 'shortWindow'],
  ['the maxima still drift one way', 'transient'],
];

/** The regime summary, ready to show. */
export interface RegimeSummaryText {
  /** The regime's plain name. */
  readonly title: string;
  /** One plain sentence. */
  readonly sentence: string;
  /** Levels dying out (collapse), exponent, horizon, period, the note on weaker evidence. */
  readonly facts: readonly SummaryFact[];
  /** The feasible equilibria, the interior one last. */
  readonly equilibria: readonly SummaryEquilibrium[];
}

/**
 * The regime in plain words with the largest exponent and its error, the predictability horizon
 * in the model's time unit (chaotic regimes), the period (cycles) and the feasible equilibria.
 */
export function regimeSummaryText(
  model: ChainModel,
  regime: RegimeResponse,
  equilibria: readonly Equilibrium[],
  locale: string,
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): RegimeSummaryText {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 3 });
  const t = model.timeUnit;
  const plural = (v: number) => `${fmt.format(v)} ${t}${v === 1 ? '' : 's'}`;
  const exponent = regime.lyapunovExponent;
  const names = new Map(model.levels.map((l) => [l.id, l]));
  const list = new Intl.ListFormat(locale, { type: 'conjunction' });
  const collapsed = (regime.regime === 'collapse' ? (regime.collapsedLevels ?? []) : []).map(
    (id) => names.get(id) ?? { name: id, unit: '' },
  );
  const collapsedNames = list.format(collapsed.map((l) => l.name));
  const facts: SummaryFact[] = [];
  if (collapsed.length) {
    facts.push({
      label: strings.collapsedLabel,
      value: list.format(
        collapsed.map((l) => (l.unit ? strings.levelWithUnit(l.name, formatUnit(l.unit)) : l.name)),
      ),
    });
  }
  facts.push(
    {
      label: strings.exponentLabel,
      value: `${fmt.format(exponent.value)} ± ${fmt.format(exponent.standardError)} ${strings.perTime(t)}`,
    },
    {
      label: strings.horizonLabel,
      value:
        regime.predictabilityHorizon !== undefined
          ? strings.about(plural(regime.predictabilityHorizon))
          : strings.notLimited,
    },
  );
  if (regime.period !== undefined) {
    facts.push({ label: strings.periodLabel, value: plural(regime.period) });
  }
  if (regime.regimeNote) {
    facts.push({
      label: strings.regimeNoteLabel,
      value: noteInWords(regime.regimeNote, collapsedNames, collapsed.length, strings),
    });
  }
  const listed = equilibria
    .filter((e) => e.feasible)
    .map((e) => ({
      name: e.present.length
        ? list.format(e.present.map((id) => names.get(id)?.name ?? id))
        : strings.everyLevelExtinct,
      state: model.levels
        .map((l) => `${l.name} ${fmt.format(e.state[l.id] ?? 0)} ${formatUnit(l.unit)}`)
        .join(', '),
      stable: e.stable,
      stability: `${e.classification}, ${e.stable ? strings.stable : strings.unstable}`,
    }));
  return {
    title: collapsed.length
      ? strings.collapseTitle(collapsedNames, collapsed.length)
      : strings.regimeName[regime.regime],
    sentence: collapsed.length
      ? strings.collapseSentence(collapsedNames, collapsed.length)
      : strings.regimeSentence[regime.regime],
    facts,
    equilibria: listed,
  };
}

/** The API's note in the host's words when it is one the engine gives, else as written. */
function noteInWords(
  note: string,
  collapsedNames: string,
  count: number,
  strings: TroplineStrings,
): string {
  const kind = NOTE_KINDS.find(([start]) => note.startsWith(start))?.[1];
  if (kind === 'dyingOut' && count > 0) return strings.regimeNote.dyingOut(collapsedNames, count);
  if (kind === 'shortWindow') return strings.regimeNote.shortWindow;
  if (kind === 'transient') return strings.regimeNote.transient;
  return note;
}
