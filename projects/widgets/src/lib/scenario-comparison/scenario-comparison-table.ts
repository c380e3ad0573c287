import type { ChainModel } from '@tropline/core/contract';
import type { ComparisonResult, LevelOutcome } from '../api/analysis-types';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';

/** Relative change from the baseline at which a difference is highlighted. */
export const NOTABLE_CHANGE = 0.1;

/** One cell of the metrics table. */
export interface ComparisonCell {
  /** The value as written, e.g. "12.3 g C m⁻²" or "week 40". */
  readonly text: string;
  /** Change against the baseline as written, e.g. "+14 %" (alternatives only). */
  readonly change?: string;
  /** Direction of the change, for the arrow. */
  readonly direction?: 'up' | 'down' | 'same';
  /** Whether the change is large enough to highlight (≥ 10 %, or a threshold newly crossed). */
  readonly notable: boolean;
}

/** One row: a metric of one level across the scenarios. */
export interface ComparisonRow {
  /** Level name. */
  readonly level: string;
  /** Metric name. */
  readonly metric: string;
  /** Baseline first, then each alternative. */
  readonly cells: readonly ComparisonCell[];
}

type Metric = 'atHorizon' | 'windowMean' | 'minimum' | 'thresholdCrossing';
const METRICS: readonly Metric[] = ['atHorizon', 'windowMean', 'minimum', 'thresholdCrossing'];

/**
 * The comparison's metrics per level and scenario, each alternative's value with its change
 * against the baseline and whether that change is notable.
 */
export function comparisonRows(
  model: ChainModel,
  result: ComparisonResult,
  locale: string,
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): ComparisonRow[] {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 3 });
  const pct = new Intl.NumberFormat(locale, {
    style: 'percent',
    maximumFractionDigits: 0,
    signDisplay: 'exceptZero',
  });
  const [baseline] = result.scenarios;
  if (!baseline) return [];
  return model.levels.flatMap((level) =>
    METRICS.map((metric) => {
      const unit = metric === 'thresholdCrossing' ? '' : ` ${formatUnit(level.unit)}`;
      const write = (o: LevelOutcome | undefined): string => {
        const v = o?.[metric];
        if (v === undefined) return '—';
        if (v === null) return strings.never;
        return metric === 'thresholdCrossing'
          ? `${model.timeUnit} ${fmt.format(v)}`
          : `${fmt.format(v)}${unit}`;
      };
      const base = baseline.levels[level.id]?.[metric];
      const cells = result.scenarios.map((s, i): ComparisonCell => {
        const v = s.levels[level.id]?.[metric];
        if (i === 0 || v === undefined || base === undefined) {
          return { text: write(s.levels[level.id]), notable: false };
        }
        if (v === null || base === null) {
          const differs = (v === null) !== (base === null);
          return { text: write(s.levels[level.id]), notable: differs };
        }
        const rel = base === 0 ? (v === 0 ? 0 : Infinity) : (v - base) / Math.abs(base);
        return {
          text: write(s.levels[level.id]),
          change: Number.isFinite(rel) ? pct.format(rel) : '—',
          direction: rel > 0.005 ? 'up' : rel < -0.005 ? 'down' : 'same',
          notable: Math.abs(rel) >= NOTABLE_CHANGE,
        };
      });
      return { level: level.name, metric: strings.metric[metric], cells };
    }),
  );
}
