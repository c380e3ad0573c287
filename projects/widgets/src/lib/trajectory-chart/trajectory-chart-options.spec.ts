import {
  describeTrajectory,
  formatUnit,
  type TrajectoryData,
  trajectoryChartOptions,
  trajectoryTable,
} from './trajectory-chart-options';

const data: TrajectoryData = {
  times: [0, 1, 2],
  timeUnit: 'year',
  series: [
    { id: 'heather', name: 'Heather', unit: 't km^-2', values: [300, 320, 0] },
    { id: 'deer', name: 'Red deer', unit: 'animals km^-2', values: [8, 9, 10] },
    { id: 'wolves', name: 'Grey wolf', unit: 'animals km^-2', values: [0.02, 0.03, 0.04] },
  ],
};
const settings = { logScale: false, colors: ['#111', '#222', '#333'], locale: 'en' };

interface AxisLike {
  type: string;
  name: string;
}
interface SeriesLike {
  id: string;
  name: string;
  type: string;
  stack?: string;
  lineStyle?: { opacity?: number; type?: unknown };
  yAxisIndex: number;
  data: [number, number | null][];
  markArea?: {
    data: [{ xAxis: number }, { xAxis: number }][];
    label: { position: string };
  };
}

describe('trajectoryChartOptions', () => {
  it('gives each distinct unit its own value axis, so levels share a scale only by unit', () => {
    const option = trajectoryChartOptions(data, settings) as {
      yAxis: AxisLike[];
      series: SeriesLike[];
    };
    expect(option.yAxis.map((a) => a.name)).toEqual(['t km⁻²', 'animals km⁻²']);
    expect(option.series.map((s) => s.yAxisIndex)).toEqual([0, 1, 1]);
  });

  it('drops non-positive values on a log scale instead of drawing them at minus infinity', () => {
    const option = trajectoryChartOptions(data, { ...settings, logScale: true }) as {
      yAxis: AxisLike[];
      series: SeriesLike[];
    };
    expect(option.yAxis.every((a) => a.type === 'log')).toBe(true);
    expect(option.series[0]!.data[2]).toEqual([2, null]);
    expect(option.series[0]!.data[1]).toEqual([1, 320]);
  });

  it('shades the span past the predictability horizon and fades every line there', () => {
    const option = trajectoryChartOptions(data, { ...settings, predictabilityHorizon: 1.5 }) as {
      series: SeriesLike[];
    };
    const mark = option.series.find((s) => s.id === 'predictability-horizon')!;
    const band = mark.markArea!.data[0]!;
    expect(band[0].xAxis).toBe(1.5);
    expect(band[1].xAxis).toBe(2);
    // Written from the band's right end, so it stays on the canvas however narrow the band.
    expect(mark.markArea!.label.position).toBe('insideTopRight');
    const deer = option.series.filter((s) => s.name === 'Red deer');
    expect(deer.map((s) => s.data.map((p) => p[0]))).toEqual([[0, 1, 2], [2]]);
    expect(deer[1]!.lineStyle!.opacity).toBeLessThan(0.5);
    expect(deer[0]!.lineStyle!.opacity).toBeUndefined();
  });

  it('draws nothing faded when the horizon lies past the end', () => {
    const option = trajectoryChartOptions(data, { ...settings, predictabilityHorizon: 9 }) as {
      series: SeriesLike[];
    };
    expect(option.series.map((s) => s.id)).toEqual(['heather', 'deer', 'wolves']);
  });

  it('gives each level its own dash pattern so colour is not the only cue', () => {
    const option = trajectoryChartOptions(data, settings) as { series: SeriesLike[] };
    const dashes = option.series.map((s) => JSON.stringify(s.lineStyle!.type));
    expect(new Set(dashes).size).toBe(3);
  });

  it('stacks an ensemble band as lower edge plus width on the level’s axis', () => {
    const option = trajectoryChartOptions(
      { ...data, bands: [{ id: 'deer', lower: [7, 8, 9], upper: [9, 11, 12] }] },
      settings,
    ) as { series: SeriesLike[] };
    const band = option.series.filter((s) => s.stack === 'band-deer');
    expect(band.map((s) => s.data.map((p) => p[1]))).toEqual([
      [7, 8, 9],
      [2, 3, 3],
    ]);
    expect(band.every((s) => s.yAxisIndex === 1)).toBe(true);
  });

  it('adds monitoring points as a scatter series, gaps kept as null', () => {
    const option = trajectoryChartOptions(
      { ...data, observations: [{ id: 'wolves', times: [0.5, 1.7], values: [0.025, null] }] },
      settings,
    ) as { series: SeriesLike[] };
    const points = option.series.find((s) => s.type === 'scatter')!;
    expect(points.name).toBe('Grey wolf (monitoring)');
    expect(points.data).toEqual([
      [0.5, 0.025],
      [1.7, null],
    ]);
  });

  it('enables the ARIA description', () => {
    const option = trajectoryChartOptions(data, settings) as {
      aria: { enabled: boolean; label: { description: string } };
    };
    expect(option.aria.enabled).toBe(true);
    expect(option.aria.label.description).toContain('Red deer ranges from 8 to 10');
  });
});

describe('formatUnit', () => {
  it('writes exponents as superscripts', () => {
    expect(formatUnit('g C m^-2')).toBe('g C m⁻²');
    expect(formatUnit('animals km^-2 yr^-1')).toBe('animals km⁻² yr⁻¹');
    expect(formatUnit('individuals')).toBe('individuals');
  });
});

describe('trajectoryTable', () => {
  it('has a time column and one column per level with its unit', () => {
    const table = trajectoryTable(data);
    expect(table.columns).toEqual([
      'time (year)',
      'Heather (t km⁻²)',
      'Red deer (animals km⁻²)',
      'Grey wolf (animals km⁻²)',
    ]);
    expect(table.rows[1]).toEqual([1, 320, 9, 0.03]);
  });
});

describe('describeTrajectory', () => {
  it('says where the predictability horizon falls', () => {
    expect(describeTrajectory(data, 'en', 1.5)).toContain(
      'past 1.5 years (the predictability horizon) the lines are faded',
    );
  });

  it('formats numbers for the locale', () => {
    expect(describeTrajectory(data, 'de', 1.5)).toContain('past 1,5 years');
  });

  it('states the span and each level’s range and end value', () => {
    const text = describeTrajectory(data, 'en');
    expect(text).toMatch(/^Trajectory of 3 food-chain levels over 2 years\./);
    expect(text).toContain('Heather ranges from 0 to 320 t km⁻² and ends at 0');
  });
});
