import type {
  ChainModel,
  ConsumerLevel,
  Equilibrium,
  ProducerLevel,
} from '@tropline/core/contract';
import type { EChartsCoreOption } from 'echarts/core';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { fitAxisNames, NAME_LINE_STYLE, VERTICAL_NAME_STYLE } from '../chart-figure/axis-name';
import { axisStyle } from '../chart-figure/axis-style';
import type { ChartTable } from '../chart-figure/chart-export';
import type {
  TrajectoryData,
  TrajectorySeries,
} from '../trajectory-chart/trajectory-chart-options';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';

/** Nullclines of a two-level chain: where each level's rate of change is zero. */
export interface Nullclines {
  /** Producer unchanging: consumer value along the producer axis, `[N, P]` pairs. */
  readonly producer: readonly (readonly [number, number])[];
  /** Consumer unchanging: the producer value N* (a vertical line), if the consumer can persist. */
  readonly consumer?: number;
}

/**
 * Interior nullclines of a two-level chain without harvest or stocking (Rosenzweig–MacArthur,
 * type II or III): N' = 0 on P = r(1 − N/K)(1 + a h Nᵏ)/(a Nᵏ⁻¹) and P' = 0 on
 * Nᵏ = m / (a (e − m h)), k = 1 for type II, 2 for type III. Undefined for other models.
 */
export function twoLevelNullclines(model: ChainModel, points = 120): Nullclines | undefined {
  if (model.levels.length !== 2 || model.harvest?.length || model.stocking?.length) return;
  const [producer, consumer] = model.levels as unknown as [ProducerLevel, ConsumerLevel];
  const { growthRate: r, carryingCapacity: K } = producer;
  const { attackRate: a, handlingTime: h, efficiency: e, mortality: m } = consumer;
  const k = consumer.response === 'type3' ? 2 : 1;
  const curve: [number, number][] = [];
  for (let i = 1; i <= points; i++) {
    const N = (K * i) / points;
    curve.push([N, (r * (1 - N / K) * (1 + a * h * N ** k)) / (a * N ** (k - 1))]);
  }
  const denominator = a * (e - m * h);
  const star = denominator > 0 ? (m / denominator) ** (1 / k) : undefined;
  return { producer: curve, ...(star !== undefined && star < K ? { consumer: star } : {}) };
}

/** What the phase portrait draws. */
export interface PhasePortraitSettings {
  /** Level id on the horizontal axis. */
  readonly x: string;
  /** Level id on the vertical axis. */
  readonly y: string;
  /** Time up to which the trajectory counts as transient (drawn faded). */
  readonly transientEnd: number;
  /** Equilibria to mark (only feasible ones are drawn). */
  readonly equilibria: readonly Equilibrium[];
  /** Nullclines, when defined for the model and the axes are its two levels. */
  readonly nullclines?: Nullclines;
  /** Colours: trajectory, nullclines. */
  readonly colors: readonly string[];
  /** Text colour. */
  readonly textColor: string;
  /** Surface colour (fill of hollow markers). */
  readonly surface: string;
  /** BCP 47 locale. */
  readonly locale: string;
  /** Whether to animate. */
  readonly animation?: boolean;
  /** The wording in use. */
  readonly strings?: TroplineStrings;
  /**
   * Width of the chart in CSS pixels, when known: the axis names wrap to the plot's width
   * instead of running past the canvas (a level's name and unit pass 320 px).
   */
  readonly width?: number;
}

/** The plane's margins around the plot, in pixels, before any room for wrapped axis names. */
const PLANE_GRID = { left: 72, right: 24, top: 56, bottom: 56 };

/** The series of one level, by id; a RangeError when the trajectory lacks it. */
export function levelSeries(data: TrajectoryData, id: string) {
  const s = data.series.find((l) => l.id === id);
  if (!s) throw new RangeError(`no level "${id}" in the trajectory`);
  return s;
}

/**
 * Index of the first sample at or after the end of the transient (at least 1, so both parts
 * have a point); the faded and the solid part share the sample there.
 */
export function transientCut(times: readonly number[], transientEnd: number): number {
  return Math.max(
    1,
    times.findIndex((t) => t >= transientEnd),
  );
}

/**
 * The scatter series marking the feasible equilibria of one stability: filled in the text
 * colour when stable, hollow on the surface colour when not (shape, not colour, carries it).
 * `at` places an equilibrium's state on the chart.
 */
export function equilibriumMarks(
  equilibria: readonly Equilibrium[],
  stable: boolean,
  style: { readonly text: string; readonly surface: string; readonly strings: TroplineStrings },
  at: (state: Readonly<Record<string, number>>) => readonly number[],
) {
  const { text, surface, strings } = style;
  return {
    name: strings.equilibriumLegend(stable),
    type: 'scatter',
    symbol: 'circle',
    symbolSize: 12,
    z: 5,
    itemStyle: stable
      ? { color: text, borderColor: text }
      : { color: surface, borderColor: text, borderWidth: 2 },
    data: equilibria
      .filter((e) => e.feasible && e.stable === stable)
      .map((e) => ({ value: at(e.state), name: e.classification })),
  };
}

/** A paragraph describing the portrait. */
export function describePhasePortrait(
  data: TrajectoryData,
  settings: Pick<PhasePortraitSettings, 'x' | 'y' | 'equilibria' | 'locale' | 'transientEnd'>,
): string {
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 3 });
  const xs = levelSeries(data, settings.x);
  const ys = levelSeries(data, settings.y);
  const feasible = settings.equilibria.filter((e) => e.feasible);
  const stable = feasible.filter((e) => e.stable).length;
  return (
    `Phase portrait of ${ys.name} against ${xs.name}. The first ` +
    `${fmt.format(settings.transientEnd)} ${data.timeUnit}s (the transient) are drawn faded. ` +
    `${feasible.length} feasible equilibria are marked, ${stable} of them stable (filled).`
  );
}

/** The portrait's points as a table: time, then the levels on its axes (two, or three). */
export function phasePortraitTable(
  data: TrajectoryData,
  x: string,
  y: string,
  depth?: string,
): ChartTable {
  const axes = [x, y, ...(depth === undefined ? [] : [depth])].map((id) => levelSeries(data, id));
  const [xs, ys] = axes as [TrajectorySeries, TrajectorySeries];
  return {
    caption:
      depth === undefined
        ? `${ys.name} against ${xs.name} over time`
        : `${axes.map((s) => s.name).join(', ')} over time`,
    columns: [`time (${data.timeUnit})`, ...axes.map((s) => `${s.name} (${formatUnit(s.unit)})`)],
    rows: data.times.map((t, k) => [t, ...axes.map((s) => s.values[k] ?? null)]),
  };
}

/**
 * Builds the ECharts option of a phase portrait: the trajectory in the plane of two levels with
 * the transient faded, equilibria marked filled (stable) or hollow (unstable), and the two
 * nullclines of a two-level chain where defined.
 */
export function phasePortraitOptions(
  data: TrajectoryData,
  settings: PhasePortraitSettings,
): EChartsCoreOption {
  const strings = settings.strings ?? DEFAULT_TROPLINE_STRINGS;
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const xs = levelSeries(data, settings.x);
  const ys = levelSeries(data, settings.y);
  const text = settings.textColor;
  const cut = transientCut(data.times, settings.transientEnd);
  // Room for each name's extra lines, so a wrapped name meets neither the legend nor the edge.
  const named = fitAxisNames(PLANE_GRID, settings.width, {
    x: `${xs.name} (${formatUnit(xs.unit)})`,
    y: `${ys.name} (${formatUnit(ys.unit)})`,
  });
  const pairs = data.times.map((_, k) => [xs.values[k]!, ys.values[k]!]);
  const line = settings.colors[0] ?? '#1565c0';
  const nullColor = settings.colors[1] ?? '#b0561d';
  const feasible = settings.equilibria.filter((e) => e.feasible);
  const marks = (stable: boolean) =>
    equilibriumMarks(feasible, stable, { text, surface: settings.surface, strings }, (state) => [
      state[settings.x]!,
      state[settings.y]!,
    ]);
  const nullclines = settings.nullclines;
  const yMax = Math.max(...pairs.map((p) => p[1]!), ...feasible.map((e) => e.state[settings.y]!));
  return {
    animation: settings.animation ?? false,
    aria: {
      enabled: true,
      label: { description: describePhasePortrait(data, settings) },
      decal: { show: true },
    },
    grid: named.grid,
    legend: { top: 0, type: 'scroll', textStyle: { color: text } },
    tooltip: { trigger: 'item', valueFormatter: (v: number) => fmt.format(v) },
    xAxis: {
      type: 'value',
      name: named.x,
      nameLocation: 'middle',
      nameGap: 30,
      nameTextStyle: { color: text, ...NAME_LINE_STYLE },
      axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
      ...axisStyle(text),
      min: 0,
    },
    yAxis: {
      type: 'value',
      name: named.y,
      // From the axis rightwards: centred on it, a long name ran off the canvas's left edge.
      nameTextStyle: { color: text, ...VERTICAL_NAME_STYLE },
      axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
      ...axisStyle(text),
      min: 0,
    },
    series: [
      {
        id: 'transient',
        name: strings.transient,
        type: 'line',
        showSymbol: false,
        color: line,
        lineStyle: { width: 1.5, opacity: 0.3, type: [4, 3] },
        data: pairs.slice(0, cut + 1),
      },
      {
        id: 'long-run',
        name: strings.longRun,
        type: 'line',
        showSymbol: false,
        color: line,
        lineStyle: { width: 2 },
        data: pairs.slice(cut),
      },
      ...(nullclines
        ? [
            {
              id: 'producer-nullcline',
              name: strings.nullcline(xs.name),
              type: 'line',
              showSymbol: false,
              color: nullColor,
              lineStyle: { width: 1.5, type: [8, 4] },
              data: nullclines.producer.filter(([, p]) => p <= yMax * 1.05),
            },
            ...(nullclines.consumer !== undefined
              ? [
                  {
                    id: 'consumer-nullcline',
                    name: strings.nullcline(ys.name),
                    type: 'line',
                    showSymbol: false,
                    color: nullColor,
                    lineStyle: { width: 1.5, type: [2, 3] },
                    data: [
                      [nullclines.consumer, 0],
                      [nullclines.consumer, yMax * 1.05],
                    ],
                  },
                ]
              : []),
          ]
        : []),
      marks(true),
      marks(false),
    ],
  };
}
