import { UPLAND_DEMO } from '@tropline/core';
import type { ComparisonResult, ScenarioOutcome } from '../api/analysis-types';
import { comparisonChartOptions, comparisonRowCount } from './scenario-comparison-options';

const { model } = UPLAND_DEMO;
/** Four scenarios with two samples each: enough to lay out, nothing computed. */
const result: ComparisonResult = {
  thresholds: {},
  scenarios: ['baseline', 'A', 'B', 'C'].map((name): ScenarioOutcome => ({
    name,
    changes: [],
    levels: Object.fromEntries(
      model.levels.map((l) => [
        l.id,
        { atHorizon: 1, windowMean: 1, minimum: 1, minimumTime: 0, thresholdCrossing: null },
      ]),
    ),
    regime: 'equilibrium',
    lyapunovExponent: { value: -0.1, standardError: 0.01 },
    times: [0, 1],
    series: Object.fromEntries(model.levels.map((l) => [l.id, [1, 2]])),
  })),
};
const settings = {
  layout: 'multiples' as const,
  level: model.levels[0]!.id,
  colors: ['#111', '#222', '#333'],
  textColor: '#000',
  locale: 'en',
};
type Laid = { grid: { top: string; height: string }[]; title: { top: string }[] };

describe('comparisonChartOptions small multiples', () => {
  it('puts three side by side by default, in percent of an unknown height', () => {
    const option = comparisonChartOptions(model, result, settings) as unknown as Laid;
    expect(comparisonRowCount(4)).toBe(2);
    expect(option.grid.map((g) => g.top)).toEqual(['14%', '14%', '14%', '64%']);
  });

  it('stacks one a row on a narrow chart, each row its own pixels', () => {
    const height = 40 + 4 * 190;
    const option = comparisonChartOptions(model, result, {
      ...settings,
      columns: 1,
      height,
    }) as unknown as Laid;
    expect(comparisonRowCount(4, 1)).toBe(4);
    expect(option.grid.map((g) => g.top)).toEqual(['68px', '258px', '448px', '638px']);
    expect(option.grid.every((g) => g.height === '126px')).toBe(true);
    // Each title sits above its own plot.
    expect(option.title.map((t) => t.top)).toEqual(['44px', '234px', '424px', '614px']);
  });
});
