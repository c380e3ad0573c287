import type { EChartsCoreOption } from 'echarts/core';
import type { Regime, SweepResult } from '../api/analysis-types';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import { fitAxisNames, NAME_LINE_STYLE, VERTICAL_NAME_STYLE } from '../chart-figure/axis-name';
import { axisStyle } from '../chart-figure/axis-style';
import type { ChartTable } from '../chart-figure/chart-export';

/** Marker shape per regime, so the legend does not rely on colour. */
export const REGIME_SYMBOLS: Readonly<Record<Regime, string>> = {
  equilibrium: 'circle',
  cycle: 'triangle',
  chaotic: 'diamond',
  collapse: 'rect',
};

/** Shape names as the legend writes them. */
const SHAPE_WORDS: Readonly<Record<Regime, string>> = {
  equilibrium: '●',
  cycle: '▲',
  chaotic: '◆',
  collapse: '■',
};

/** Labels of the two axes. */
export interface BifurcationAxes {
  /** Swept parameter, e.g. "Handling time h of Water flea (week)". */
  readonly parameter: string;
  /** Observed level with its unit, e.g. "Juvenile yellow perch (g C m⁻²)". */
  readonly observed: string;
}

/** Settings of {@link bifurcationChartOptions}. */
export interface BifurcationSettings {
  /** Axis labels. */
  readonly axes: BifurcationAxes;
  /** The parameter's current value, marked with a vertical line. */
  readonly current?: number;
  /** Colour per regime. */
  readonly colors: Readonly<Record<Regime, string>>;
  /** Text colour. */
  readonly textColor: string;
  /** BCP 47 locale. */
  readonly locale: string;
  /** The wording in use. */
  readonly strings?: TroplineStrings;
  /**
   * Width of the chart in CSS pixels, when known: the axis names then break into lines that
   * fit the plot (a parameter's description and a level's name and unit pass 320 px).
   */
  readonly width?: number;
}

/** The plot's margins, in pixels, before any room for wrapped axis names. */
const BIFURCATION_GRID = { left: 72, right: 32, top: 56, bottom: 56 };

const REGIMES: readonly Regime[] = ['equilibrium', 'cycle', 'chaotic', 'collapse'];

/**
 * Marker of a value where a level dies out without peaks: a downward triangle (drawn as a path,
 * so the legend shows it too), distinct in shape from every regime's marker.
 */
export const DECLINING_SYMBOL = 'path://M0,0L10,0L5,9Z';

/** The values classified collapse with no maxima: a level declining without oscillating. */
export function decliningValues(result: SweepResult): number[] {
  return result.points
    .filter((p) => p.regime === 'collapse' && !p.maxima.length)
    .map((p) => p.value);
}

/** Up to six values in the locale, then "…" and the last. */
function listValues(values: readonly number[], fmt: Intl.NumberFormat): string {
  const shown = values.length > 6 ? [...values.slice(0, 5), Number.NaN, values.at(-1)!] : values;
  return shown.map((v) => (Number.isNaN(v) ? '…' : fmt.format(v))).join(', ');
}

/** A paragraph describing the diagram: the range and where each regime occurs. */
export function describeBifurcation(
  result: SweepResult,
  axes: BifurcationAxes,
  locale: string,
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): string {
  const fmt = new Intl.NumberFormat(locale, { maximumSignificantDigits: 3 });
  const values = result.points.map((p) => p.value);
  const spans: string[] = [];
  let start = 0;
  for (let i = 1; i <= result.points.length; i++) {
    const here = result.points[i]?.regime;
    if (here !== result.points[start]!.regime) {
      const from = result.points[start]!;
      const to = result.points[i - 1]!;
      spans.push(
        `${strings.regimeName[from.regime].toLowerCase()} from ${fmt.format(from.value)} ` +
          `to ${fmt.format(to.value)}`,
      );
      start = i;
    }
  }
  const declining = decliningValues(result);
  return (
    `Bifurcation diagram: the long-run maxima of ${axes.observed} for ${values.length} values ` +
    `of ${axes.parameter} from ${fmt.format(Math.min(...values))} to ` +
    `${fmt.format(Math.max(...values))}. Regimes: ${spans.join('; ')}.` +
    (declining.length
      ? ' ' + strings.decliningSummary(declining.length, listValues(declining, fmt))
      : '')
  );
}

/** Every maximum as a table row: parameter value, regime, maximum. */
export function bifurcationTable(
  result: SweepResult,
  axes: BifurcationAxes,
  strings: TroplineStrings = DEFAULT_TROPLINE_STRINGS,
): ChartTable {
  return {
    caption: `Long-run maxima of ${axes.observed} against ${axes.parameter}`,
    columns: [axes.parameter, 'Regime', `Maxima of ${axes.observed}`],
    rows: result.points.map((p) => [
      p.value,
      strings.regimeName[p.regime],
      p.maxima.length
        ? p.maxima.map((m) => m.toPrecision(4)).join(' ')
        : p.regime === 'collapse'
          ? strings.decliningCell
          : '—',
    ]),
  };
}

/**
 * Builds the ECharts option of a bifurcation diagram: one scatter series per regime (its own
 * colour and marker shape, named with the shape in the legend) of every long-run maximum of the
 * observed level against the swept value, the values where a level dies out without peaks marked
 * ▼ on the zero line (their own series and legend entry), and the current value marked.
 */
export function bifurcationChartOptions(
  result: SweepResult,
  settings: BifurcationSettings,
): EChartsCoreOption {
  const strings = settings.strings ?? DEFAULT_TROPLINE_STRINGS;
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const text = settings.textColor;
  const values = result.points.map((p) => p.value);
  // Only regimes with maxima to plot: an empty series would still take a legend entry.
  const present = REGIMES.filter((r) =>
    result.points.some((p) => p.regime === r && p.maxima.length),
  );
  const series: Record<string, unknown>[] = present.map((regime) => ({
    id: regime,
    name: `${strings.regimeName[regime]} ${SHAPE_WORDS[regime]}`,
    type: 'scatter',
    symbol: REGIME_SYMBOLS[regime],
    symbolSize: regime === 'chaotic' ? 4 : 6,
    large: true,
    color: settings.colors[regime],
    data: result.points
      .filter((p) => p.regime === regime)
      .flatMap((p) => p.maxima.map((m) => [p.value, m])),
  }));
  const declining = decliningValues(result);
  if (declining.length) {
    // Nothing else would be drawn there: the level's long run is zero, so the marks sit on it.
    series.push({
      id: 'collapse-declining',
      name: strings.decliningLegend,
      type: 'scatter',
      symbol: DECLINING_SYMBOL,
      symbolSize: 9,
      symbolOffset: [0, '-50%'],
      color: settings.colors.collapse,
      data: declining.map((v) => [v, 0]),
    });
  }
  if (settings.current !== undefined) {
    // On its own empty series: scatter series drawn in `large` mode do not render mark lines.
    series.push({
      id: 'current-value',
      type: 'line',
      data: [],
      markLine: {
        silent: true,
        symbol: 'none',
        lineStyle: { color: text, type: [6, 3], width: 2 },
        label: {
          color: text,
          // Along the line inside the plot: above its end, the label met the level's name.
          position: 'insideEndTop',
          formatter: `${strings.currentValue}: ${fmt.format(settings.current)}`,
        },
        data: [{ xAxis: settings.current }],
      },
    });
  }
  const named = fitAxisNames(BIFURCATION_GRID, settings.width, {
    x: settings.axes.parameter,
    y: settings.axes.observed,
  });
  return {
    animation: false,
    aria: {
      enabled: true,
      label: {
        description: describeBifurcation(result, settings.axes, settings.locale, strings),
      },
      decal: { show: true },
    },
    grid: named.grid,
    // One row whatever the width (paged when narrow), so it never meets the level's name.
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
      min: Math.min(...values),
      max: Math.max(...values),
    },
    yAxis: {
      type: 'value',
      name: named.y,
      nameTextStyle: { color: text, ...VERTICAL_NAME_STYLE },
      axisLabel: { color: text, formatter: (v: number) => fmt.format(v) },
      ...axisStyle(text),
      // Zero kept in range when values declining to it are marked there.
      scale: !declining.length,
    },
    series,
  };
}
