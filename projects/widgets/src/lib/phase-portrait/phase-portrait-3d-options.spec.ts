import { findEquilibria, HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import { engineTrajectory } from '@tropline/widgets/testing';
import {
  DEFAULT_VIEW_ANGLES,
  describePhasePortrait3d,
  phasePortrait3dOptions,
  projectPoint,
  turnView,
  type Vec3,
  viewBasis,
} from './phase-portrait-3d-options';
import { phasePortraitTable } from './phase-portrait-options';

// The expected projections below are worked by hand from the definition of an orthographic
// view (common practice): the screen shows a point's components along "right" and "up", and
// drops the one towards the reader.
const X: Vec3 = [1, 0, 0];
const Y: Vec3 = [0, 1, 0];
const Z: Vec3 = [0, 0, 1];
const S = Math.SQRT1_2;

function expectVec(actual: Vec3, expected: Vec3) {
  actual.forEach((v, i) => expect(v).toBeCloseTo(expected[i]!, 12));
}

describe('viewBasis and projectPoint', () => {
  it('looking along the across axis shows depth across and up as up', () => {
    const b = viewBasis({ azimuth: 0, elevation: 0 });
    expectVec(projectPoint(X, b), [0, 0, 1]); // points at the reader: a dot at the centre
    expectVec(projectPoint(Y, b), [1, 0, 0]);
    expectVec(projectPoint(Z, b), [0, 1, 0]);
  });

  it('turning a quarter turn brings the depth axis towards the reader', () => {
    const b = viewBasis({ azimuth: 90, elevation: 0 });
    expectVec(projectPoint(X, b), [-1, 0, 0]);
    expectVec(projectPoint(Y, b), [0, 0, 1]);
    expectVec(projectPoint(Z, b), [0, 1, 0]);
  });

  it('turning 45° splits the floor axes evenly', () => {
    const b = viewBasis({ azimuth: 45, elevation: 0 });
    expectVec(projectPoint(X, b), [-S, 0, S]);
    expectVec(projectPoint(Y, b), [S, 0, S]);
  });

  it('looking straight down shows the floor: across to the right, depth up the screen', () => {
    const b = viewBasis({ azimuth: -90, elevation: 90 });
    expectVec(projectPoint(X, b), [1, 0, 0]);
    expectVec(projectPoint(Y, b), [0, 1, 0]);
    expectVec(projectPoint(Z, b), [0, 0, 1]);
  });

  it('is a rotation for any view: orthonormal, right-handed, lengths kept', () => {
    for (const azimuth of [-170, -55, 0, 33, 120]) {
      for (const elevation of [-80, -10, 0, 25, 90]) {
        const { right: r, up: u, toViewer: d } = viewBasis({ azimuth, elevation });
        const dot = (p: Vec3, q: Vec3) => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
        for (const [p, q, want] of [
          [r, r, 1],
          [u, u, 1],
          [d, d, 1],
          [r, u, 0],
          [r, d, 0],
          [u, d, 0],
        ] as const) {
          expect(dot(p, q)).toBeCloseTo(want, 12);
        }
        // right × up = toViewer (a mirror image would give −toViewer).
        expectVec(
          [r[1] * u[2] - r[2] * u[1], r[2] * u[0] - r[0] * u[2], r[0] * u[1] - r[1] * u[0]],
          d,
        );
        const p: Vec3 = [0.3, -1.2, 2.5];
        const [a, b, c] = projectPoint(p, { right: r, up: u, toViewer: d });
        expect(a * a + b * b + c * c).toBeCloseTo(dot(p, p), 12);
      }
    }
  });
});

describe('turnView', () => {
  it('turns by a step, wrapping the azimuth and stopping the tilt at straight up or down', () => {
    expect(turnView({ azimuth: 170, elevation: 0 }, 'right')).toEqual({
      azimuth: -175,
      elevation: 0,
    });
    expect(turnView({ azimuth: -175, elevation: 0 }, 'left')).toEqual({
      azimuth: 170,
      elevation: 0,
    });
    expect(turnView({ azimuth: 0, elevation: 85 }, 'up').elevation).toBe(90);
    expect(turnView({ azimuth: 0, elevation: -85 }, 'down').elevation).toBe(-90);
    expect(turnView({ azimuth: 40, elevation: 10 }, 'reset')).toEqual(DEFAULT_VIEW_ANGLES);
  });
});

describe('phasePortrait3dOptions', () => {
  const { model, initial } = HASTINGS_POWELL_BENCHMARK;
  const data = engineTrajectory(model, initial, 200, 201);
  const { run } = data;
  const [x, y, depth] = model.levels.map((l) => l.id) as [string, string, string];
  const equilibria = findEquilibria(model);
  const settings = {
    x,
    y,
    depth,
    angles: { azimuth: 0, elevation: 0 },
    aspect: 1,
    transientEnd: 50,
    equilibria,
    colors: ['#111', '#777'],
    textColor: '#000',
    surface: '#fff',
    locale: 'en',
  };
  interface SeriesLike {
    id?: string;
    name?: string;
    data: ({ value: number[]; name?: string } | (number | null)[])[];
  }
  const seriesOf = (angles = settings.angles) =>
    (phasePortrait3dOptions(data, { ...settings, angles }) as { series: SeriesLike[] }).series;
  // The box reaches each level's largest value, on the trajectory or at a feasible equilibrium.
  const top = (id: string) =>
    Math.max(
      ...data.series.find((s) => s.id === id)!.values,
      ...equilibria.filter((e) => e.feasible).map((e) => e.state[id]!),
    );

  it('seen along the across axis, is the plane of the other two levels, scaled into the box', () => {
    const longRun = seriesOf().find((s) => s.id === 'long-run')!;
    const k = 150;
    const [u, v, t] = longRun.data[k - 50] as number[];
    expect(t).toBe(data.times[k]);
    expect(u).toBeCloseTo(run.series[depth]![k]! / top(depth) - 0.5, 12);
    expect(v).toBeCloseTo(run.series[y]![k]! / top(y) - 0.5, 12);
  });

  it('seen from above, is the plane of across and depth', () => {
    const transient = seriesOf({ azimuth: -90, elevation: 90 }).find((s) => s.id === 'transient')!;
    const [u, v] = transient.data[10] as number[];
    expect(u).toBeCloseTo(run.series[x]![10]! / top(x) - 0.5, 12);
    expect(v).toBeCloseTo(run.series[depth]![10]! / top(depth) - 0.5, 12);
  });

  it('fades the transient, draws the twelve edges of the box and labels the three axes', () => {
    const series = seriesOf(DEFAULT_VIEW_ANGLES);
    const transient = series.find((s) => s.id === 'transient')!;
    const longRun = series.find((s) => s.id === 'long-run')!;
    expect(transient.data.length + longRun.data.length).toBe(data.times.length + 1);
    const segments = (id: string) =>
      series.find((s) => s.id === id)!.data.filter((p) => Array.isArray(p) && p[0] === null).length;
    expect(segments('axes') + segments('box')).toBe(12);
    const labels = series.find((s) => s.id === 'axis-labels')!.data as { name: string }[];
    expect(labels.map((l) => l.name.split('\n')[0])).toEqual([
      model.levels[0]!.name,
      model.levels[2]!.name,
      model.levels[1]!.name,
      '0',
    ]);
  });

  it('marks every feasible equilibrium, stable ones filled', () => {
    const marks = seriesOf().filter((s) => s.name?.startsWith('Equilibrium'));
    expect(marks.map((m) => m.data.length).reduce((a, b) => a + b)).toBe(
      equilibria.filter((e) => e.feasible).length,
    );
  });

  it('describes the view in words and lists all three levels in its table', () => {
    const text = describePhasePortrait3d(data, { ...settings, angles: DEFAULT_VIEW_ANGLES });
    expect(text).toContain(`Three-level view of ${model.levels[0]!.name} (across)`);
    expect(text).toContain('turned -55° and tilted 25°');
    const table = phasePortraitTable(data, x, y, depth);
    expect(table.columns).toHaveLength(4);
    expect(table.rows[3]).toEqual([
      data.times[3],
      run.series[x]![3],
      run.series[y]![3],
      run.series[depth]![3],
    ]);
  });
});
