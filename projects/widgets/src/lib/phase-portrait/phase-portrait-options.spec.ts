import { findEquilibria, ROSENZWEIG_MACARTHUR } from '@tropline/core';
import { engineTrajectory } from '@tropline/widgets/testing';
import {
  describePhasePortrait,
  phasePortraitOptions,
  phasePortraitTable,
  twoLevelNullclines,
} from './phase-portrait-options';

const { model, initial } = ROSENZWEIG_MACARTHUR;
const data = engineTrajectory(model, initial, 50, 101);
const [x, y] = model.levels.map((l) => l.id) as [string, string];
const equilibria = findEquilibria(model);

interface SeriesLike {
  id?: string;
  name: string;
  data: unknown[];
  itemStyle?: { color: string };
}

describe('twoLevelNullclines', () => {
  it('crosses the interior equilibrium the engine finds', () => {
    const lines = twoLevelNullclines(model, 2000)!;
    const interior = equilibria.find((e) => e.kind === 'interior')!;
    expect(lines.consumer).toBeCloseTo(interior.state[x]!, 6);
    // The producer nullcline passes through the interior equilibrium too (to grid resolution).
    const nearest = lines.producer.reduce((best, pt) =>
      Math.abs(pt[0] - lines.consumer!) < Math.abs(best[0] - lines.consumer!) ? pt : best,
    );
    expect(Math.abs(nearest[1] - interior.state[y]!)).toBeLessThan(0.01 * interior.state[y]!);
  });

  it('is undefined for three levels or with harvest', () => {
    expect(
      twoLevelNullclines({ ...model, harvest: [{ level: y, kind: 'effort', rate: 0.1 }] }),
    ).toBeUndefined();
  });
});

describe('phasePortraitOptions', () => {
  const settings = {
    x,
    y,
    transientEnd: 10,
    equilibria,
    nullclines: twoLevelNullclines(model),
    colors: ['#111', '#222'],
    textColor: '#000',
    surface: '#fff',
    locale: 'en',
  };

  it('splits the trajectory at the end of the transient, sharing the point there', () => {
    const option = phasePortraitOptions(data, settings) as { series: SeriesLike[] };
    const transient = option.series.find((s) => s.id === 'transient')!;
    const longRun = option.series.find((s) => s.id === 'long-run')!;
    expect(transient.data.length + longRun.data.length).toBe(data.times.length + 1);
    expect(transient.data.at(-1)).toEqual(longRun.data[0]);
  });

  it('marks stable equilibria filled and unstable ones hollow, named in the legend', () => {
    const option = phasePortraitOptions(data, settings) as { series: SeriesLike[] };
    const stable = option.series.find((s) => s.name.includes('stable (●)'))!;
    const unstable = option.series.find((s) => s.name.includes('unstable (○)'))!;
    expect(stable.itemStyle!.color).toBe('#000');
    expect(unstable.itemStyle!.color).toBe('#fff');
    const feasible = equilibria.filter((e) => e.feasible);
    expect(stable.data.length + unstable.data.length).toBe(feasible.length);
  });

  it('draws both nullclines of the two-level chain', () => {
    const option = phasePortraitOptions(data, settings) as { series: SeriesLike[] };
    expect(option.series.map((s) => s.id)).toContain('producer-nullcline');
    expect(option.series.map((s) => s.id)).toContain('consumer-nullcline');
  });
});

describe('phasePortraitOptions at a known width', () => {
  const settings = {
    x,
    y,
    transientEnd: 10,
    equilibria,
    colors: ['#111', '#222'],
    textColor: '#000',
    surface: '#fff',
    locale: 'en',
  };
  interface AxisLike {
    name: string;
    nameTextStyle: { width?: number; overflow?: string; align?: string };
  }
  type Plane = { xAxis: AxisLike; yAxis: AxisLike; grid: { top: number; bottom: number } };

  it('keeps names that fit the plot on one line, the vertical one starting at its axis', () => {
    // 320 px less the grid's 72 px left and 24 px right margins: "Prey (dimensionless)" fits.
    const option = phasePortraitOptions(data, { ...settings, width: 320 }) as Plane;
    expect(option.xAxis.name).not.toContain('\n');
    expect(option.yAxis.nameTextStyle).toMatchObject({ align: 'left' });
    expect(option.grid).toMatchObject({ top: 56, bottom: 56 });
  });

  it('breaks a name wider than the plot at its spaces and makes room for the extra lines', () => {
    const narrow = phasePortraitOptions(data, { ...settings, width: 200 }) as Plane;
    // 200 − 96 = 104 px of plot: every line of both names within it (6.6 px a character).
    for (const name of [narrow.xAxis.name, narrow.yAxis.name]) {
      expect(name).toContain('\n');
      for (const line of name.split('\n')) expect(line.length * 6.6).toBeLessThanOrEqual(104);
    }
    expect(narrow.grid.bottom).toBe(56 + 16 * (narrow.xAxis.name.split('\n').length - 1));
    expect(narrow.grid.top).toBe(56 + 16 * (narrow.yAxis.name.split('\n').length - 1));
    const unknown = phasePortraitOptions(data, settings) as Plane;
    expect(unknown.xAxis.name).not.toContain('\n');
    expect(unknown.grid).toMatchObject({ top: 56, bottom: 56 });
  });
});

describe('describePhasePortrait and phasePortraitTable', () => {
  it('names the axes, the faded transient and the equilibria', () => {
    const text = describePhasePortrait(data, { x, y, equilibria, locale: 'en', transientEnd: 10 });
    expect(text).toContain(
      `Phase portrait of ${model.levels[1]!.name} against ${model.levels[0]!.name}`,
    );
    expect(text).toMatch(/feasible equilibria are marked, \d of them stable/);
  });

  it('lists time and both levels', () => {
    const table = phasePortraitTable(data, x, y);
    expect(table.columns).toHaveLength(3);
    expect(table.rows).toHaveLength(data.times.length);
  });
});
