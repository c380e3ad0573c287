import type { EChartsCoreOption } from 'echarts/core';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { axisStyle } from '../chart-figure/axis-style';
import type { ChartTable } from '../chart-figure/chart-export';
import { formatUnit, LINE_DASHES, POINT_SYMBOLS } from './trajectory-chart-format';

export { formatUnit } from './trajectory-chart-format';

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

/** An uncertainty band of one level (e.g. an ensemble's 5th to 95th percentile). */
export interface TrajectoryBand {
  /** Level id the band belongs to. */
  readonly id: string;
  /** Lower edge, one value per time of the trajectory. */
  readonly lower: readonly number[];
  /** Upper edge, one value per time. */
  readonly upper: readonly number[];
}

/** Observed monitoring values of one level, at their own (possibly uneven) times. */
export interface TrajectoryObservations {
  /** Level id the observations belong to. */
  readonly id: string;
  /** Survey times in the model's time unit. */
  readonly times: readonly number[];
  /** Observed values; null where a survey missed. */
  readonly values: readonly (number | null)[];
}

/** What the trajectory chart draws. */
export interface TrajectoryData {
  /** Sample times, increasing. */
  readonly times: readonly number[];
  /** Unit of time, e.g. "year". */
  readonly timeUnit: string;
  /** Every level, producer first. */
  readonly series: readonly TrajectorySeries[];
  /** Uncertainty bands, when an ensemble gave them. */
  readonly bands?: readonly TrajectoryBand[];
  /** Monitoring points, when given. */
  readonly observations?: readonly TrajectoryObservations[];
}

/** Presentation choices for {@link trajectoryChartOptions}. */
export interface TrajectoryChartSettings {
  /** Whether the value axes are logarithmic (useful when levels differ by orders of magnitude). */
  readonly logScale: boolean;
  /** Series colours, producer first (CSS colours, resolved from --tropline-series-*). */
  readonly colors: readonly string[];
  /** BCP 47 locale for numbers. */
  readonly locale: string;
  /** Time after which a chaotic projection is not meaningful; de-emphasised when given. */
  readonly predictabilityHorizon?: number;
  /** Text colour for axes and legend (resolved from the theme). */
  readonly textColor?: string;
  /** Whether the reader can zoom the time axis. */
  readonly zoom?: boolean;
  /** Whether to animate (off when the reader prefers reduced motion). */
  readonly animation?: boolean;
  /** Font family of the chart text. */
  readonly fontFamily?: string;
  /** The wording in use. */
  readonly strings?: TroplineStrings;
}

const last = <T>(xs: readonly T[]): T | undefined => xs[xs.length - 1];

/** A paragraph that describes the chart for screen readers and as its caption. */
export function describeTrajectory(
  data: TrajectoryData,
  locale: string,
  predictabilityHorizon?: number,
): string {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 3 });
  const end = last(data.times) ?? 0;
  const parts = data.series.map((s) => {
    const finite = s.values.filter(Number.isFinite);
    const min = finite.length ? Math.min(...finite) : NaN;
    const max = finite.length ? Math.max(...finite) : NaN;
    return (
      `${s.name} ranges from ${fmt.format(min)} to ${fmt.format(max)} ${formatUnit(s.unit)} ` +
      `and ends at ${fmt.format(last(s.values) ?? NaN)}`
    );
  });
  const bands = data.bands?.length
    ? ' Shaded bands show where 90 % of the uncertain runs lie (5th to 95th percentile).'
    : '';
  const observed = data.observations?.length
    ? ` Monitoring values are marked as points for ${data.observations.length} level(s).`
    : '';
  const horizon =
    predictabilityHorizon !== undefined && predictabilityHorizon < end
      ? ` The regime is chaotic: past ${fmt.format(predictabilityHorizon)} ${data.timeUnit}s ` +
        `(the predictability horizon) the lines are faded and are not meaningful.`
      : '';
  return (
    `Trajectory of ${data.series.length} food-chain levels over ${fmt.format(end)} ` +
    `${data.timeUnit}s. ${parts.join('; ')}.${bands}${observed}${horizon}`
  );
}

/** The trajectory as a table: one row per sample time, one column per level. */
export function trajectoryTable(
  data: TrajectoryData,
  strings = DEFAULT_TROPLINE_STRINGS,
): ChartTable {
  return {
    caption: `Values of every level over time (${data.timeUnit})`,
    columns: [
      strings.timeAxis(data.timeUnit),
      ...data.series.map((s) => `${s.name} (${formatUnit(s.unit)})`),
    ],
    rows: data.times.map((t, k) => [t, ...data.series.map((s) => s.values[k] ?? null)]),
  };
}

/**
 * Builds the ECharts option for a trajectory: one line per level (its own dash pattern and an
 * end label, so colour is never the only cue), one value axis per distinct unit, uncertainty
 * bands and monitoring points when given, the span past the predictability horizon shaded with
 * the lines there faded, time-axis zoom, and the ARIA description.
 */
export function trajectoryChartOptions(
  data: TrajectoryData,
  settings: TrajectoryChartSettings,
): EChartsCoreOption {
  const strings = settings.strings ?? DEFAULT_TROPLINE_STRINGS;
  const units = [...new Set(data.series.map((s) => s.unit))];
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const text = settings.textColor ?? '#333';
  const end = last(data.times) ?? 0;
  const horizon = settings.predictabilityHorizon;
  const faded = horizon !== undefined && horizon < end;
  const color = (i: number) => settings.colors[i % settings.colors.length];
  const value = (v: number | null | undefined) =>
    v === null || v === undefined || (settings.logScale && v <= 0) ? null : v;
  const yAxis = units.map((unit, i) => ({
    type: settings.logScale ? 'log' : 'value',
    name: formatUnit(unit),
    nameTextStyle: { color: text },
    position: i % 2 === 0 ? 'left' : 'right',
    offset: Math.floor(i / 2) * 56,
    axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
    ...axisStyle(text),
    axisLine: { ...axisStyle(text).axisLine, show: true },
    splitLine: { ...axisStyle(text).splitLine, show: i === 0 },
    scale: !settings.logScale,
  }));
  const lines = data.series.flatMap((s, i) => {
    const base = {
      name: s.name,
      type: 'line',
      showSymbol: false,
      sampling: 'lttb',
      yAxisIndex: units.indexOf(s.unit),
      color: color(i),
      lineStyle: { width: 2, type: LINE_DASHES[i % LINE_DASHES.length] },
    };
    const points = data.times.map((t, k) => [t, value(s.values[k])]);
    if (!faded) {
      return [{ ...base, id: s.id, data: points }];
    }
    // Split at the horizon; both halves share the point there so the line stays continuous.
    const cut = data.times.findIndex((t) => t >= horizon);
    return [
      { ...base, id: s.id, data: points.slice(0, cut + 1) },
      {
        ...base,
        id: `${s.id}-past-horizon`,
        data: points.slice(cut),
        lineStyle: { ...base.lineStyle, opacity: 0.35 },
        emphasis: { disabled: true },
      },
    ];
  });
  const bands = (data.bands ?? []).flatMap((b) => {
    const i = data.series.findIndex((s) => s.id === b.id);
    if (i < 0) return [];
    const s = data.series[i]!;
    const common = {
      type: 'line',
      stack: `band-${b.id}`,
      yAxisIndex: units.indexOf(s.unit),
      showSymbol: false,
      silent: true,
      lineStyle: { opacity: 0 },
      tooltip: { show: false },
    };
    return [
      {
        ...common,
        id: `${b.id}-band-lower`,
        name: strings.band(s.name),
        data: data.times.map((t, k) => [t, value(b.lower[k])]),
        color: color(i),
      },
      {
        ...common,
        id: `${b.id}-band`,
        name: strings.band(s.name),
        color: color(i),
        areaStyle: { color: color(i), opacity: 0.18 },
        data: data.times.map((t, k) => [t, Math.max(0, (b.upper[k] ?? 0) - (b.lower[k] ?? 0))]),
      },
    ];
  });
  const observed = (data.observations ?? []).flatMap((o) => {
    const i = data.series.findIndex((s) => s.id === o.id);
    if (i < 0) return [];
    const s = data.series[i]!;
    return [
      {
        id: `${o.id}-observed`,
        name: strings.observed(s.name),
        type: 'scatter',
        yAxisIndex: units.indexOf(s.unit),
        symbol: POINT_SYMBOLS[i % POINT_SYMBOLS.length],
        symbolSize: 8,
        itemStyle: { color: color(i), borderColor: text, borderWidth: 1 },
        data: o.times.map((t, k) => [t, value(o.values[k])]),
      },
    ];
  });
  const horizonMarks = faded
    ? [
        {
          id: 'predictability-horizon',
          type: 'line',
          data: [],
          markArea: {
            silent: true,
            itemStyle: { color: 'rgba(128, 128, 128, 0.14)' },
            // From the band's right end leftwards: centred on a narrow band near the end, the
            // label ran past the canvas at 320 px.
            label: { color: text, position: 'insideTopRight', formatter: strings.pastHorizon },
            data: [[{ xAxis: horizon }, { xAxis: end }]],
          },
          markLine: {
            silent: true,
            symbol: 'none',
            lineStyle: { color: text, type: 'solid', width: 1 },
            label: { show: false },
            data: [{ xAxis: horizon }],
          },
        },
      ]
    : [];
  const zoom = settings.zoom ?? true;
  return {
    animation: settings.animation ?? false,
    aria: {
      enabled: true,
      label: { description: describeTrajectory(data, settings.locale, horizon) },
      decal: { show: true },
    },
    textStyle: { fontFamily: settings.fontFamily ?? 'Roboto, sans-serif' },
    grid: {
      left: 64 + Math.floor((units.length - 1) / 2) * 56,
      right: units.length > 1 ? 72 : 24,
      top: 56,
      bottom: zoom ? 88 : 56,
    },
    // Bands share their level's colour and are named in the summary, not the legend.
    legend: {
      top: 0,
      type: 'scroll',
      data: [...data.series.map((s) => s.name), ...observed.map((o) => o.name)],
      textStyle: { color: text },
    },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (v: number | null) => (v === null ? '—' : fmt.format(v)),
    },
    dataZoom: zoom
      ? [
          { type: 'inside', xAxisIndex: 0, filterMode: 'none' },
          { type: 'slider', xAxisIndex: 0, filterMode: 'none', bottom: 8, height: 24 },
        ]
      : [],
    xAxis: {
      type: 'value',
      name: strings.timeAxis(data.timeUnit),
      nameLocation: 'middle',
      nameGap: 30,
      nameTextStyle: { color: text },
      axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
      ...axisStyle(text),
      min: data.times[0],
      max: end,
    },
    yAxis,
    series: [...bands, ...lines, ...observed, ...horizonMarks],
  };
}
