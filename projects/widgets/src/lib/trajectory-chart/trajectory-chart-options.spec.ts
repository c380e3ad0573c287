import {
  describeTrajectory,
  formatUnit,
  type TrajectoryData,
  trajectoryChartOptions,
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
  yAxisIndex: number;
  data: [number, number | null][];
  markArea?: { data: [{ xAxis: number }, { xAxis: number }][] };
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

  it('shades the span past the predictability horizon', () => {
    const option = trajectoryChartOptions(data, { ...settings, predictabilityHorizon: 1.5 }) as {
      series: SeriesLike[];
    };
    const band = option.series[0]!.markArea!.data[0]!;
    expect(band[0].xAxis).toBe(1.5);
    expect(band[1].xAxis).toBe(2);
    expect(option.series[1]!.markArea).toBeUndefined();
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

describe('describeTrajectory', () => {
  it('states the span and each level’s range and end value', () => {
    const text = describeTrajectory(data, 'en');
    expect(text).toMatch(/^Trajectory of 3 food-chain levels over 2 years\./);
    expect(text).toContain('Heather ranges from 0 to 320 t km⁻² and ends at 0');
  });
});
