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

/** The regime summary, ready to show. */
export interface RegimeSummaryText {
  /** The regime's plain name. */
  readonly title: string;
  /** One plain sentence. */
  readonly sentence: string;
  /** Exponent, horizon, period. */
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
  const facts: SummaryFact[] = [
    {
      label: strings.exponentLabel,
      value: `${fmt.format(exponent.value)} ± ${fmt.format(exponent.standardError)} per ${t}`,
    },
    {
      label: strings.horizonLabel,
      value:
        regime.predictabilityHorizon !== undefined
          ? `about ${plural(regime.predictabilityHorizon)}`
          : strings.notLimited,
    },
  ];
  if (regime.period !== undefined) {
    facts.push({ label: strings.periodLabel, value: plural(regime.period) });
  }
  const names = new Map(model.levels.map((l) => [l.id, l]));
  const list = equilibria
    .filter((e) => e.feasible)
    .map((e) => ({
      name: e.present.length
        ? e.present.map((id) => names.get(id)?.name ?? id).join(' and ')
        : 'Every level extinct',
      state: model.levels
        .map((l) => `${l.name} ${fmt.format(e.state[l.id] ?? 0)} ${formatUnit(l.unit)}`)
        .join(', '),
      stable: e.stable,
      stability: `${e.classification}, ${e.stable ? strings.stable : strings.unstable}`,
    }));
  return {
    title: strings.regimeName[regime.regime],
    sentence: strings.regimeSentence[regime.regime],
    facts,
    equilibria: list,
  };
}
