import type { EChartsCoreOption } from 'echarts/core';

/** One level's values over time, with what a reader needs to understand them. */
export interface TrajectorySeries {
  /** Level id from the model. */
  readonly id: string;
  /** Display name, e.g. "Zooplankton". */
  readonly name: string;
  /** Unit of the values, e.g. "g C m^-2". */
  readonly unit: string;
  /** One value per time. */
  readonly values: readonly number[];
}

/** What the trajectory chart draws. */
export interface TrajectoryData {
  /** Sample times, increasing. */
  readonly times: readonly number[];
  /** Unit of time, e.g. "year". */
  readonly timeUnit: string;
  /** Every level, producer first. */
  readonly series: readonly TrajectorySeries[];
}

/** Presentation choices for {@link trajectoryChartOptions}. */
export interface TrajectoryChartSettings {
  /** Whether the value axes are logarithmic (useful when levels differ by orders of magnitude). */
  readonly logScale: boolean;
  /** Series colours, producer first (CSS colours, resolved from --tropline-series-*). */
  readonly colors: readonly string[];
  /** BCP 47 locale for numbers. */
  readonly locale: string;
  /** Time after which a chaotic projection is not meaningful; shaded when given. */
  readonly predictabilityHorizon?: number;
  /** Text colour for axes and legend (resolved from the theme). */
  readonly textColor?: string;
}

/** Writes "g C m^-2" as "g C m⁻²" for display. */
export function formatUnit(unit: string): string {
  const sup: Record<string, string> = {
    '-': '⁻',
    '0': '⁰',
    '1': '¹',
    '2': '²',
    '3': '³',
    '4': '⁴',
    '5': '⁵',
    '6': '⁶',
    '7': '⁷',
    '8': '⁸',
    '9': '⁹',
  };
  return unit.replace(/\^(-?\d+)/g, (_m, exp: string) => [...exp].map((c) => sup[c]).join(''));
}

/** A one-sentence description of the chart for screen readers. */
export function describeTrajectory(data: TrajectoryData, locale: string): string {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 3 });
  const end = data.times.length ? data.times[data.times.length - 1]! : 0;
  const parts = data.series.map((s) => {
    const last = s.values[s.values.length - 1] ?? NaN;
    const min = Math.min(...s.values);
    const max = Math.max(...s.values);
    return (
      `${s.name} ranges from ${fmt.format(min)} to ${fmt.format(max)} ${formatUnit(s.unit)} ` +
      `and ends at ${fmt.format(last)}`
    );
  });
  return (
    `Trajectory of ${data.series.length} food-chain levels over ${fmt.format(end)} ` +
    `${data.timeUnit}s. ${parts.join('; ')}.`
  );
}

/**
 * Builds the ECharts option for a trajectory: one line per level, one value axis per distinct
 * unit (so levels in different units are never read against the wrong scale), a shaded band
 * past the predictability horizon, and an ARIA description.
 */
export function trajectoryChartOptions(
  data: TrajectoryData,
  settings: TrajectoryChartSettings,
): EChartsCoreOption {
  const units = [...new Set(data.series.map((s) => s.unit))];
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const text = settings.textColor ?? '#333';
  const yAxis = units.map((unit, i) => ({
    type: settings.logScale ? 'log' : 'value',
    name: formatUnit(unit),
    nameTextStyle: { color: text },
    position: i % 2 === 0 ? 'left' : 'right',
    offset: Math.floor(i / 2) * 56,
    axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
    axisLine: { show: true },
    splitLine: { show: i === 0 },
    scale: !settings.logScale,
  }));
  const series = data.series.map((s, i) => ({
    id: s.id,
    name: s.name,
    type: 'line',
    showSymbol: false,
    sampling: 'lttb',
    yAxisIndex: units.indexOf(s.unit),
    color: settings.colors[i % settings.colors.length],
    lineStyle: { width: 2 },
    // Positive values only on a log axis; zero would be drawn at -infinity.
    data: data.times.map((t, k) => {
      const v = s.values[k]!;
      return [t, settings.logScale && v <= 0 ? null : v];
    }),
    ...(i === 0 && settings.predictabilityHorizon !== undefined
      ? {
          markArea: {
            silent: true,
            itemStyle: { color: 'rgba(120, 120, 120, 0.12)' },
            label: { color: text, position: 'insideTop' },
            data: [
              [
                { name: 'Past the predictability horizon', xAxis: settings.predictabilityHorizon },
                { xAxis: data.times[data.times.length - 1] },
              ],
            ],
          },
        }
      : {}),
  }));
  return {
    animation: false,
    aria: { enabled: true, label: { description: describeTrajectory(data, settings.locale) } },
    textStyle: { fontFamily: 'Roboto, sans-serif' },
    grid: {
      left: 64 + Math.floor((units.length - 1) / 2) * 56,
      right: units.length > 1 ? 72 : 24,
      top: 48,
      bottom: 56,
    },
    legend: { top: 0, textStyle: { color: text } },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (v: number | null) => (v === null ? '—' : fmt.format(v)),
    },
    xAxis: {
      type: 'value',
      name: `time (${data.timeUnit})`,
      nameLocation: 'middle',
      nameGap: 30,
      nameTextStyle: { color: text },
      axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
      min: data.times[0],
      max: data.times[data.times.length - 1],
    },
    yAxis,
    series,
  };
}
