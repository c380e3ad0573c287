import type { SweepResult } from '../api/analysis-types';
import {
  bifurcationChartOptions,
  bifurcationTable,
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
