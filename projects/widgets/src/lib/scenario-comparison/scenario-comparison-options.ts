import type { ChainModel } from '@tropline/core/contract';
import type { EChartsCoreOption } from 'echarts/core';
import type { ComparisonResult } from '../api/analysis-types';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { fitAxisNames, NAME_LINE_STYLE, VERTICAL_NAME_STYLE } from '../chart-figure/axis-name';
import { axisStyle } from '../chart-figure/axis-style';
import type { ChartTable } from '../chart-figure/chart-export';
import { formatUnit, LINE_DASHES } from '../trajectory-chart/trajectory-chart-format';

/** How the scenarios are laid out. */
export type ComparisonLayout = 'overlay' | 'multiples';

/** Settings of {@link comparisonChartOptions}. */
export interface ComparisonChartSettings {
  /** One chart with every scenario, or one chart per scenario. */
  readonly layout: ComparisonLayout;
  /** Level drawn in the overlay. */
  readonly level: string;
  /** Series colours (scenarios in the overlay, levels in the multiples). */
  readonly colors: readonly string[];
  /** Text colour. */
  readonly textColor: string;
  /** BCP 47 locale. */
  readonly locale: string;
  /** The wording in use. */
  readonly strings?: TroplineStrings;
  /** Small multiples per row (default up to 3); fewer on a narrow chart. */
  readonly columns?: number;
  /** The chart's height in pixels, when known: the multiples are then laid out in pixels. */
  readonly height?: number;
  /** The chart's width in pixels, when known: the overlay's axis names then break to fit. */
  readonly width?: number;
}

/** Rows of small multiples for `n` scenarios in `columns` columns. */
export function comparisonRowCount(n: number, columns = Math.min(3, n)): number {
  return Math.ceil(n / Math.max(1, Math.min(columns, n)));
}

/** A paragraph describing the comparison chart. */
export function describeComparison(
  model: ChainModel,
  result: ComparisonResult,
  settings: Pick<ComparisonChartSettings, 'layout' | 'level' | 'locale'>,
): string {
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 3 });
  const level = model.levels.find((l) => l.id === settings.level)!;
  const ends = result.scenarios
    .map((s) => `${s.name} ${fmt.format(s.levels[level.id]?.atHorizon ?? NaN)}`)
    .join(', ');
  const how =
    settings.layout === 'overlay'
      ? `${level.name} under ${result.scenarios.length} scenarios on one chart`
      : `every level, one chart for each of ${result.scenarios.length} scenarios`;
  return `Scenario comparison: ${how}. ${level.name} at the horizon (${formatUnit(level.unit)}): ${ends}.`;
}

/** The chosen level under every scenario as a table. */
export function comparisonTable(
  model: ChainModel,
  result: ComparisonResult,
  levelId: string,
): ChartTable {
  const level = model.levels.find((l) => l.id === levelId)!;
  const times = result.scenarios[0]?.times ?? [];
  return {
    caption: `${level.name} (${formatUnit(level.unit)}) under each scenario over time`,
    columns: [`time (${model.timeUnit})`, ...result.scenarios.map((s) => s.name)],
    rows: times.map((t, k) => [t, ...result.scenarios.map((s) => s.series[levelId]?.[k] ?? null)]),
  };
}

/**
 * Builds the comparison chart: an overlay of one level under every scenario (each with its own
 * dash pattern and end label), or small multiples with every level, one grid per scenario on
 * shared axes.
 */
export function comparisonChartOptions(
  model: ChainModel,
  result: ComparisonResult,
  settings: ComparisonChartSettings,
): EChartsCoreOption {
  const strings = settings.strings ?? DEFAULT_TROPLINE_STRINGS;
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const text = settings.textColor;
  const axisLabel = { color: text, formatter: (v: number) => fmt.format(v) };
  const base = {
    animation: false,
    aria: {
      enabled: true,
      label: { description: describeComparison(model, result, settings) },
      decal: { show: true },
    },
    tooltip: { trigger: 'axis', valueFormatter: (v: number) => fmt.format(v) },
  };
  const color = (i: number) => settings.colors[i % settings.colors.length];
  const dash = (i: number) => LINE_DASHES[i % LINE_DASHES.length];
  if (settings.layout === 'overlay') {
    const level = model.levels.find((l) => l.id === settings.level)!;
    // The right margin holds the scenarios' end labels.
    const named = fitAxisNames({ left: 72, right: 120, top: 56, bottom: 56 }, settings.width, {
      x: strings.timeAxis(model.timeUnit),
      y: `${level.name} (${formatUnit(level.unit)})`,
    });
    return {
      ...base,
      grid: named.grid,
      legend: { top: 0, type: 'scroll', textStyle: { color: text } },
      xAxis: {
        type: 'value',
        name: named.x,
        nameLocation: 'middle',
        nameGap: 30,
        nameTextStyle: { color: text, ...NAME_LINE_STYLE },
        axisLabel,
        ...axisStyle(text),
      },
      yAxis: {
        type: 'value',
        name: named.y,
        nameTextStyle: { color: text, ...VERTICAL_NAME_STYLE },
        axisLabel,
        ...axisStyle(text),
      },
      series: result.scenarios.map((s, i) => ({
        id: `scenario-${i}`,
        name: s.name,
        type: 'line',
        showSymbol: false,
        color: color(i),
        lineStyle: { width: i === 0 ? 3 : 2, type: dash(i) },
        endLabel: { show: true, formatter: s.name, color: text },
        data: s.times.map((t, k) => [t, s.series[level.id]?.[k] ?? null]),
      })),
    };
  }
  const n = result.scenarios.length;
  const cols = Math.max(1, Math.min(settings.columns ?? 3, n));
  const rows = comparisonRowCount(n, cols);
  // In pixels when the height is known: a legend band, then per row a title, the plot and its
  // axis labels. Otherwise in percent of an unknown height.
  const legend = 40;
  const rowHeight = settings.height ? (settings.height - legend) / rows : undefined;
  const rowTop = (r: number) =>
    rowHeight ? `${legend + r * rowHeight + 4}px` : `${(r * 100) / rows + 7}%`;
  const grids = result.scenarios.map((_, i) => {
    const c = i % cols;
    const r = Math.floor(i / cols);
    return {
      left: `${(c * 100) / cols + 6}%`,
      width: `${100 / cols - 9}%`,
      top: rowHeight ? `${legend + r * rowHeight + 28}px` : `${(r * 100) / rows + 14}%`,
      height: rowHeight ? `${rowHeight - 64}px` : `${100 / rows - 24}%`,
      // A 6 % margin is about 18 px at 320 px wide, less than a two-digit axis label needs.
      containLabel: true,
    };
  });
  return {
    ...base,
    legend: {
      top: 0,
      type: 'scroll',
      data: model.levels.map((l) => l.name),
      textStyle: { color: text },
    },
    title: result.scenarios.map((s, i) => ({
      text: s.name,
      left: grids[i]!.left,
      top: rowTop(Math.floor(i / cols)),
      textStyle: { color: text, fontSize: 13, fontWeight: 500 },
    })),
    grid: grids,
    xAxis: grids.map((_, i) => ({ type: 'value', gridIndex: i, axisLabel, ...axisStyle(text) })),
    yAxis: grids.map((_, i) => ({ type: 'value', gridIndex: i, axisLabel, ...axisStyle(text) })),
    series: result.scenarios.flatMap((s, i) =>
      model.levels.map((l, j) => ({
        id: `scenario-${i}-${l.id}`,
        name: l.name,
        type: 'line',
        showSymbol: false,
        xAxisIndex: i,
        yAxisIndex: i,
        color: color(j),
        lineStyle: { width: 1.5, type: dash(j) },
        data: s.times.map((t, k) => [t, s.series[l.id]?.[k] ?? null]),
      })),
    ),
  };
}
