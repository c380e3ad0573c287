import { UPLAND_DEMO } from '@tropline/core';
import type { ComparisonResult, LevelOutcome, ScenarioOutcome } from '../api/analysis-types';
import {
  comparisonChartOptions,
  comparisonTable,
  describeComparison,
} from './scenario-comparison-options';
import { comparisonRows } from './scenario-comparison-table';

const model = UPLAND_DEMO.model;
const ids = model.levels.map((l) => l.id);
const outcome = (atHorizon: number, crossing: number | null): LevelOutcome => ({
  atHorizon,
  windowMean: atHorizon,
  minimum: atHorizon / 2,
  minimumTime: 3,
  thresholdCrossing: crossing,
});
const scenario = (name: string, scale: number, crossing: number | null): ScenarioOutcome => ({
  name,
  changes: [],
  levels: Object.fromEntries(ids.map((id) => [id, outcome(10 * scale, crossing)])),
  regime: 'equilibrium',
  lyapunovExponent: { value: -0.1, standardError: 0.01 },
  times: [0, 1, 2],
  series: Object.fromEntries(ids.map((id) => [id, [1, 2, 3 * scale]])),
});
const result: ComparisonResult = {
  thresholds: Object.fromEntries(ids.map((id) => [id, 0.1])),
  scenarios: [
    scenario('baseline', 1, null),
    scenario('More culling', 1.04, null),
    scenario('No wolves', 0.5, 12),
  ],
};

describe('comparisonRows', () => {
  const rows = comparisonRows(model, result, 'en');

  it('has four metrics per level with the baseline first', () => {
    expect(rows).toHaveLength(4 * ids.length);
    expect(rows[0]!.metric).toBe('At the horizon');
    expect(rows[0]!.cells[0]!.change).toBeUndefined();
  });

  it('writes each change against the baseline and highlights only large ones', () => {
    const [, small, large] = rows[0]!.cells;
    expect(small).toMatchObject({ change: '+4%', direction: 'up', notable: false });
    expect(large).toMatchObject({ change: '-50%', direction: 'down', notable: true });
  });

  it('highlights a threshold crossed under an alternative but never under the baseline', () => {
    const crossing = rows.find((r) => r.metric === 'First below threshold')!;
    expect(crossing.cells.map((c) => c.text)).toEqual(['never', 'never', 'year 12']);
    expect(crossing.cells[2]!.notable).toBe(true);
    expect(crossing.cells[1]!.notable).toBe(false);
  });
});

describe('comparisonChartOptions', () => {
  const settings = { level: ids[0]!, colors: ['#1', '#2', '#3'], textColor: '#000', locale: 'en' };

  it('overlays one level under every scenario', () => {
    const option = comparisonChartOptions(model, result, { ...settings, layout: 'overlay' }) as {
      series: { name: string; data: unknown[] }[];
    };
    expect(option.series.map((s) => s.name)).toEqual(['baseline', 'More culling', 'No wolves']);
    expect(option.series[2]!.data).toEqual([
      [0, 1],
      [1, 2],
      [2, 1.5],
    ]);
  });

  it('draws one grid per scenario with every level in small multiples', () => {
    const option = comparisonChartOptions(model, result, { ...settings, layout: 'multiples' }) as {
      grid: unknown[];
      series: { xAxisIndex: number }[];
    };
    expect(option.grid).toHaveLength(3);
    expect(option.series).toHaveLength(3 * ids.length);
    expect(option.series.at(-1)!.xAxisIndex).toBe(2);
  });

  it('describes and tabulates the chosen level', () => {
    expect(describeComparison(model, result, { ...settings, layout: 'overlay' })).toContain(
      'under 3 scenarios on one chart',
    );
    expect(comparisonTable(model, result, ids[0]!).columns).toEqual([
      'time (year)',
      'baseline',
      'More culling',
      'No wolves',
    ]);
  });
});
