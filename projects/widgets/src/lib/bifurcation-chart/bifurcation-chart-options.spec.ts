import type { SweepResult } from '../api/analysis-types';
import {
  bifurcationChartOptions,
  bifurcationTable,
  DECLINING_SYMBOL,
  describeBifurcation,
  REGIME_SYMBOLS,
} from './bifurcation-chart-options';

const result: SweepResult = {
  points: [
    { value: 2, maxima: [0.5], regime: 'equilibrium' },
    { value: 2.5, maxima: [0.6, 0.61], regime: 'cycle' },
    { value: 3, maxima: [0.4, 0.7, 0.55], regime: 'chaotic' },
    { value: 3.5, maxima: [0.45, 0.66], regime: 'chaotic' },
  ],
};
const axes = { parameter: 'b1', observed: 'Top predator (g C m⁻²)' };
const colors = { equilibrium: '#1', cycle: '#2', chaotic: '#3', collapse: '#4' };

interface SeriesLike {
  id: string;
  name: string;
  symbol: string;
  data: number[][];
  markLine?: { data: { xAxis: number }[] };
}

describe('bifurcationChartOptions', () => {
  const option = bifurcationChartOptions(result, {
    axes,
    current: 3,
    colors,
    textColor: '#000',
    locale: 'en',
  }) as { series: SeriesLike[] };

  it('draws one series per regime present, each with its own shape named in the legend', () => {
    expect(option.series.map((s) => s.id)).toEqual([
      'equilibrium',
      'cycle',
      'chaotic',
      'current-value',
    ]);
    expect(option.series.slice(0, 3).map((s) => s.symbol)).toEqual([
      REGIME_SYMBOLS.equilibrium,
      REGIME_SYMBOLS.cycle,
      REGIME_SYMBOLS.chaotic,
    ]);
    expect(option.series.slice(0, 3).map((s) => s.name)).toEqual([
      'Settles ●',
      'Cycles ▲',
      'Irregular (chaotic) ◆',
    ]);
  });

  it('plots every maximum against its parameter value', () => {
    expect(option.series[2]!.data).toEqual([
      [3, 0.4],
      [3, 0.7],
      [3, 0.55],
      [3.5, 0.45],
      [3.5, 0.66],
    ]);
  });

  it('marks the current value', () => {
    expect(option.series.at(-1)!.markLine!.data).toEqual([{ xAxis: 3 }]);
  });
});

// A collapse with no maxima: the observed level declines without oscillating (e.g. a top
// predator that cannot invade), so the sweep has no peaks to plot there.
const dying: SweepResult = {
  points: [
    { value: 0.01, maxima: [0.5, 0.52], regime: 'cycle' },
    { value: 0.015, maxima: [0.2, 0.1], regime: 'collapse' },
    { value: 0.02, maxima: [], regime: 'collapse' },
    { value: 0.025, maxima: [], regime: 'collapse' },
  ],
};

describe('values where a level dies out without peaks', () => {
  const option = bifurcationChartOptions(dying, {
    axes,
    colors,
    textColor: '#000',
    locale: 'en',
  }) as { series: (SeriesLike & { color: string })[]; yAxis: { scale: boolean } };

  it('marks them on the zero line with their own shape and a legend name in words', () => {
    const marks = option.series.find((s) => s.id === 'collapse-declining')!;
    expect(marks.data).toEqual([
      [0.02, 0],
      [0.025, 0],
    ]);
    expect(marks.symbol).toBe(DECLINING_SYMBOL);
    expect(Object.values(REGIME_SYMBOLS)).not.toContain(marks.symbol);
    expect(marks.name).toBe('Dies out, no peaks (▼ on the zero line)');
    expect(marks.color).toBe(colors.collapse);
    // The collapse with peaks keeps its square markers; zero is in the vertical range.
    expect(option.series.find((s) => s.id === 'collapse')!.data).toEqual([
      [0.015, 0.2],
      [0.015, 0.1],
    ]);
    expect(option.yAxis.scale).toBe(false);
  });

  it('gives the square marker no legend entry when no collapse has peaks to plot', () => {
    const onlyDeclining = bifurcationChartOptions(
      { points: dying.points.filter((p) => p.regime !== 'collapse' || !p.maxima.length) },
      { axes, colors, textColor: '#000', locale: 'en' },
    ) as { series: SeriesLike[] };
    expect(onlyDeclining.series.map((s) => s.id)).toEqual(['cycle', 'collapse-declining']);
  });

  it('says them in the summary and the table', () => {
    expect(describeBifurcation(dying, axes, 'de')).toContain(
      'At 2 values (0,02, 0,025) the level declines toward zero without peaks; these are ' +
        'marked ▼ on the zero line.',
    );
    const rows = bifurcationTable(dying, axes).rows;
    expect(rows[1]![2]).toBe('0.2000 0.1000');
    expect(rows[2]).toEqual([0.02, 'A level dies out', 'none: declines toward zero (▼)']);
  });

  it('adds nothing when every value has peaks', () => {
    const plain = bifurcationChartOptions(result, {
      axes,
      colors,
      textColor: '#000',
      locale: 'en',
    }) as { series: SeriesLike[]; yAxis: { scale: boolean } };
    expect(plain.series.some((s) => s.id === 'collapse-declining')).toBe(false);
    expect(plain.yAxis.scale).toBe(true);
    expect(describeBifurcation(result, axes, 'en')).not.toContain('▼');
  });
});

describe('describeBifurcation', () => {
  it('names the range and the spans of each regime', () => {
    expect(describeBifurcation(result, axes, 'en')).toBe(
      'Bifurcation diagram: the long-run maxima of Top predator (g C m⁻²) for 4 values of b1 ' +
        'from 2 to 3.5. Regimes: settles from 2 to 2; cycles from 2.5 to 2.5; ' +
        'irregular (chaotic) from 3 to 3.5.',
    );
  });
});

describe('bifurcationTable', () => {
  it('has one row per value with the regime in words', () => {
    const table = bifurcationTable(result, axes);
    expect(table.rows[1]).toEqual([2.5, 'Cycles', '0.6000 0.6100']);
  });
});
