import type { Equilibrium } from '@tropline/core/contract';
import type { EChartsCoreOption } from 'echarts/core';
import { DEFAULT_TROPLINE_STRINGS, type TroplineStrings } from '../api/tropline-strings';
import type { TrajectoryData } from '../trajectory-chart/trajectory-chart-options';
import { formatUnit } from '../trajectory-chart/trajectory-chart-format';
import { equilibriumMarks, levelSeries, transientCut } from './phase-portrait-options';

/** A point or direction in the box's frame: across, depth, up. */
export type Vec3 = readonly [number, number, number];

/** Where the reader looks at the box from, in degrees. */
export interface ViewAngles {
  /** Turn about the vertical axis; 0 looks along the across axis, towards its start. */
  readonly azimuth: number;
  /** Height above the floor of the box; 90 looks straight down. */
  readonly elevation: number;
}

/** The view the three-level portrait opens with: a corner view from a little above. */
export const DEFAULT_VIEW_ANGLES: ViewAngles = { azimuth: -55, elevation: 25 };

/** The screen's axes in the box's frame: right and up on screen, and towards the reader. */
export interface ViewBasis {
  readonly right: Vec3;
  readonly up: Vec3;
  readonly toViewer: Vec3;
}

const RAD = Math.PI / 180;

/**
 * The orthonormal camera frame of an orthographic view (common practice, as in any viewing
 * transform): the reader sits at azimuth a and elevation e, so towards the reader is
 * (cos e cos a, cos e sin a, sin e), screen right is (−sin a, cos a, 0) and screen up is
 * toViewer × right = (−sin e cos a, −sin e sin a, cos e). right × up = toViewer, so the frame is
 * a rotation (never a mirror image) for every angle.
 */
export function viewBasis(angles: ViewAngles): ViewBasis {
  const a = angles.azimuth * RAD;
  const e = angles.elevation * RAD;
  return {
    right: [-Math.sin(a), Math.cos(a), 0],
    up: [-Math.sin(e) * Math.cos(a), -Math.sin(e) * Math.sin(a), Math.cos(e)],
    toViewer: [Math.cos(e) * Math.cos(a), Math.cos(e) * Math.sin(a), Math.sin(e)],
  };
}

const dot = (p: Vec3, q: Vec3) => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];

/** A point on screen (right, up) and its depth towards the reader. */
export function projectPoint(p: Vec3, basis: ViewBasis): Vec3 {
  return [dot(p, basis.right), dot(p, basis.up), dot(p, basis.toViewer)];
}

/** What a key does to the view. */
export type ViewKey = 'left' | 'right' | 'up' | 'down' | 'reset';

/** Degrees one key press turns or tilts the box. */
export const VIEW_STEP = 15;

/**
 * The keyboard's way of turning the box: left and right turn it about the vertical axis
 * (azimuth kept within −180…180), up and down tilt it (elevation within −90…90), reset goes
 * back to the opening view.
 */
export function turnView(angles: ViewAngles, key: ViewKey, step = VIEW_STEP): ViewAngles {
  const wrap = (deg: number) => ((((deg + 180) % 360) + 360) % 360) - 180;
  const clamp = (deg: number) => Math.min(90, Math.max(-90, deg));
  switch (key) {
    case 'left':
      return { ...angles, azimuth: wrap(angles.azimuth - step) };
    case 'right':
      return { ...angles, azimuth: wrap(angles.azimuth + step) };
    case 'up':
      return { ...angles, elevation: clamp(angles.elevation + step) };
    case 'down':
      return { ...angles, elevation: clamp(angles.elevation - step) };
    case 'reset':
      return DEFAULT_VIEW_ANGLES;
  }
}

/** What the three-level portrait draws. */
export interface PhasePortrait3dSettings {
  /** Level id along the box's across axis. */
  readonly x: string;
  /** Level id on the box's vertical axis. */
  readonly y: string;
  /** Level id along the box's depth axis. */
  readonly depth: string;
  /** Where the reader looks from. */
  readonly angles: ViewAngles;
  /** Width over height of the chart, so the box is not stretched. */
  readonly aspect: number;
  /** Time up to which the trajectory counts as transient (drawn faded). */
  readonly transientEnd: number;
  /** Equilibria to mark (only feasible ones are drawn). */
  readonly equilibria: readonly Equilibrium[];
  /** Colours: trajectory, box edges. */
  readonly colors: readonly string[];
  /** Text colour (labels, the three axes from the origin). */
  readonly textColor: string;
  /** Surface colour (fill of hollow markers). */
  readonly surface: string;
  /** BCP 47 locale. */
  readonly locale: string;
  /** Whether to animate. */
  readonly animation?: boolean;
  /** The wording in use. */
  readonly strings?: TroplineStrings;
}

/** The box's eight corners in unit coordinates (0 or 1 on each axis). */
const CORNERS: readonly Vec3[] = [0, 1, 2, 3, 4, 5, 6, 7].map(
  (i) => [i & 1, (i >> 1) & 1, (i >> 2) & 1] as const,
);
/** The three edges from the origin corner: the axes. */
const AXIS_EDGES: readonly [number, number][] = [
  [0, 1],
  [0, 2],
  [0, 4],
];
/** The other nine edges of the box. */
const FAR_EDGES: readonly [number, number][] = [
  [1, 3],
  [1, 5],
  [2, 3],
  [2, 6],
  [4, 5],
  [4, 6],
  [3, 7],
  [5, 7],
  [6, 7],
];

/**
 * Where an axis is labelled: the middle of whichever of the box's four edges along it lies
 * farthest from the centre on screen (an outline edge, so the label stays clear of the
 * drawing); the edge through the origin when several are as far.
 */
function labelPlace(axis: number, screen: (unit: Vec3) => number[]): number[] {
  let best: number[] = [];
  let reach = -1;
  for (const [a, b] of [
    [0, 0],
    [1, 0],
    [0, 1],
    [1, 1],
  ] as const) {
    const mid: [number, number, number] = [a, a, a];
    mid[axis] = 0.5;
    mid[(axis + 1) % 3] = a;
    mid[(axis + 2) % 3] = b;
    const at = screen(mid);
    const d = at[0]! ** 2 + at[1]! ** 2;
    if (d > reach + 1e-9) {
      reach = d;
      best = at;
    }
  }
  return best;
}

/** Half the box's diagonal in unit coordinates: no view projects the box beyond it. */
const REACH = Math.sqrt(3) / 2;

/** The largest value of each axis' level (data and feasible equilibria), for the box's size. */
function extents(data: TrajectoryData, s: PhasePortrait3dSettings) {
  return [s.x, s.depth, s.y].map((id) => {
    const values = levelSeries(data, id).values;
    const at = s.equilibria.filter((e) => e.feasible).map((e) => e.state[id] ?? 0);
    const top = Math.max(0, ...values.filter(Number.isFinite), ...at);
    return top > 0 ? top : 1;
  }) as unknown as Vec3;
}

/** A paragraph describing the three-level view. */
export function describePhasePortrait3d(
  data: TrajectoryData,
  settings: Pick<
    PhasePortrait3dSettings,
    'x' | 'y' | 'depth' | 'angles' | 'equilibria' | 'locale' | 'transientEnd'
  >,
): string {
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 3 });
  const [xs, ys, ds] = [settings.x, settings.y, settings.depth].map((id) => levelSeries(data, id));
  const feasible = settings.equilibria.filter((e) => e.feasible);
  const stable = feasible.filter((e) => e.stable).length;
  return (
    `Three-level view of ${xs!.name} (across), ${ds!.name} (depth) and ${ys!.name} (up), ` +
    `turned ${fmt.format(settings.angles.azimuth)}° and tilted ` +
    `${fmt.format(settings.angles.elevation)}°. The first ${fmt.format(settings.transientEnd)} ` +
    `${data.timeUnit}s (the transient) are drawn faded. ${feasible.length} feasible equilibria ` +
    `are marked, ${stable} of them stable (filled).`
  );
}

/**
 * Builds the ECharts option of the three-level portrait on an ordinary 2-D chart: each level
 * scaled into a unit box (0 to its largest value), the box and the trajectory projected
 * orthographically for the given view, the three axes from the origin drawn strong and
 * labelled with name, range and unit, the transient faded as in the plane, and the equilibria
 * marked filled (stable) or hollow (unstable).
 */
export function phasePortrait3dOptions(
  data: TrajectoryData,
  settings: PhasePortrait3dSettings,
): EChartsCoreOption {
  const strings = settings.strings ?? DEFAULT_TROPLINE_STRINGS;
  const fmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 4 });
  const basis = viewBasis(settings.angles);
  const top = extents(data, settings);
  const ids = [settings.x, settings.depth, settings.y];
  const [xs, ds, ys] = ids.map((id) => levelSeries(data, id));
  // Unit box centred on the origin of the screen, so turning it keeps it in place.
  const screen = (unit: Vec3) =>
    projectPoint([unit[0] - 0.5, unit[1] - 0.5, unit[2] - 0.5], basis).slice(0, 2);
  const scaled = (values: readonly number[]): Vec3 => [
    values[0]! / top[0],
    values[1]! / top[1],
    values[2]! / top[2],
  ];
  const text = settings.textColor;
  const line = settings.colors[0] ?? '#1565c0';
  const edge = settings.colors[1] ?? '#6f7978';
  const points = data.times.map((t, k) => {
    const v = [xs!.values[k]!, ds!.values[k]!, ys!.values[k]!];
    return [...screen(scaled(v)), t, ...v];
  });
  const cut = transientCut(data.times, settings.transientEnd);
  const edges = (list: readonly [number, number][]) =>
    list.flatMap(([a, b]) => [screen(CORNERS[a]!), screen(CORNERS[b]!), [null, null]]);
  const labelFmt = new Intl.NumberFormat(settings.locale, { maximumSignificantDigits: 3 });
  const origin = screen([0, 0, 0]);
  const axisLabels = [0, 1, 2].map((axis) => {
    const s = [xs, ds, ys][axis]!;
    const at = labelPlace(axis, screen);
    // Beside the middle of the box's outermost edge along the axis, on its outer side.
    const position =
      Math.abs(at[0]!) >= Math.abs(at[1]!)
        ? at[0]! >= 0
          ? 'right'
          : 'left'
        : at[1]! >= 0
          ? 'top'
          : 'bottom';
    return {
      value: at,
      name: `${s.name}\n0–${labelFmt.format(top[axis]!)} ${formatUnit(s.unit)}`,
      label: { position, distance: 6 },
    };
  });
  // Equal units across and up, whatever the chart's shape; the box fits in any view.
  const half = REACH * 1.06;
  const wide = Math.max(1, settings.aspect);
  const tall = Math.max(1, 1 / settings.aspect);
  const hidden = { show: false };
  const trajectory = (id: string, name: string, from: number, to: number, faded: boolean) => ({
    id,
    name,
    type: 'line',
    showSymbol: false,
    color: line,
    encode: { x: 0, y: 1 },
    lineStyle: faded ? { width: 1.5, opacity: 0.3, type: [4, 3] } : { width: 2 },
    data: points.slice(from, to),
  });
  const row = (label: string, v: number) => `${label}: ${fmt.format(v)}`;
  return {
    animation: settings.animation ?? false,
    aria: {
      enabled: true,
      label: { description: describePhasePortrait3d(data, settings) },
      decal: { show: true },
    },
    grid: { left: 8, right: 8, top: 40, bottom: 8 },
    legend: {
      top: 0,
      type: 'scroll',
      textStyle: { color: text },
      data: [strings.transient, strings.longRun, ...[true, false].map(strings.equilibriumLegend)],
    },
    tooltip: {
      trigger: 'item',
      formatter: (p: { data?: unknown }) => {
        const d = Array.isArray(p.data) ? (p.data as number[]) : undefined;
        if (!d || d.length < 6) return '';
        return [
          row(`time (${data.timeUnit})`, d[2]!),
          row(xs!.name, d[3]!),
          row(ds!.name, d[4]!),
          row(ys!.name, d[5]!),
        ].join('<br>');
      },
    },
    xAxis: { type: 'value', min: -half * wide, max: half * wide, ...hidden },
    yAxis: { type: 'value', min: -half * tall, max: half * tall, ...hidden },
    series: [
      {
        id: 'box',
        type: 'line',
        silent: true,
        showSymbol: false,
        color: edge,
        lineStyle: { width: 1, opacity: 0.7 },
        data: edges(FAR_EDGES),
      },
      {
        id: 'axes',
        type: 'line',
        silent: true,
        showSymbol: false,
        color: text,
        lineStyle: { width: 1.5 },
        data: edges(AXIS_EDGES),
      },
      {
        id: 'axis-labels',
        type: 'scatter',
        silent: true,
        symbolSize: 0,
        label: {
          show: true,
          color: text,
          formatter: (p: { name: string }) => p.name,
          lineHeight: 16,
        },
        data: [...axisLabels, { value: origin, name: '0', label: { position: 'bottom' } }],
      },
      trajectory('transient', strings.transient, 0, cut + 1, true),
      trajectory('long-run', strings.longRun, cut, points.length, false),
      ...[true, false].map((stable) =>
        equilibriumMarks(
          settings.equilibria,
          stable,
          { text, surface: settings.surface, strings },
          (state) => screen(scaled(ids.map((id) => state[id] ?? 0))),
        ),
      ),
    ],
  };
}
