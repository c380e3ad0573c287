// Engine benchmark: the issue-3 workload at rtol 1e-8 through odex, against a plain baseline in
// the same run (odex with default options apart from tolerance and step budget, and a naive RHS
// that reads the model object and allocates a fresh array on every call).
import { Solver, type Derivative } from 'odex';
import {
  absoluteFloor,
  compileChain,
  HASTINGS_POWELL_BENCHMARK as B,
  integrateChain,
  withParameter,
  type ChainModel,
  type ConsumerLevel,
} from '@tropline/core';

const TOL = 1e-8;
// The engine's own absolute floor (as `project` uses it), given to both paths: the same work.
const ATOL = absoluteFloor(TOL, [1, 1, 1])[0]!;
const HORIZON = 10_000;
const TRANSIENT = 5_000;
const REPEATS = 7;
const DT = 0.5; // sampling of the top level over the window, for counting maxima
const Y0 = [0.8, 0.2, 9];

/** The naive RHS a first attempt would write: model lookups, a new array per call. */
function naiveRhs(model: ChainModel, counter: { n: number }): Derivative {
  return (_t, y) => {
    counter.n++;
    const out: number[] = [];
    const levels = model.levels;
    for (let j = 0; j < levels.length; j++) {
      const feed = (k: number) => {
        const c = levels[k] as ConsumerLevel;
        return (c.attackRate * y[k - 1]!) / (1 + c.attackRate * c.handlingTime * y[k - 1]!);
      };
      let d =
        j === 0
          ? levels[0].growthRate * y[0]! * (1 - y[0]! / levels[0].carryingCapacity)
          : ((levels[j] as ConsumerLevel).efficiency * feed(j) -
              (levels[j] as ConsumerLevel).mortality) *
            y[j]!;
      if (j + 1 < levels.length) d -= feed(j + 1) * y[j + 1]!;
      out.push(d);
    }
    return out;
  };
}

/** Local maxima of a sampled series that stand out of rounding noise (at an equilibrium: 0). */
function countMaxima(z: ArrayLike<number>): number {
  let count = 0;
  for (let i = 1; i + 1 < z.length; i++) {
    const v = z[i]!;
    if (v > z[i - 1]! && v >= z[i + 1]! && v - Math.min(z[i - 1]!, z[i + 1]!) > 1e-9 * Math.abs(v))
      count++;
  }
  return count;
}

interface Run {
  wallMs: number;
  evals: number;
  steps: number;
  maxima?: number[];
}

function engineTrajectory(): Run {
  const k = compileChain(B.model);
  const times = Float64Array.from({ length: HORIZON + 1 }, (_, i) => i);
  const t0 = performance.now();
  const r = integrateChain(k, Y0, {
    t1: HORIZON,
    tolerance: TOL,
    absoluteTolerance: ATOL,
    sampleTimes: times,
    onSample: () => {},
    wallTimeMs: 600_000,
  });
  return {
    wallMs: performance.now() - t0,
    evals: r.diagnostics.rhsEvaluations,
    steps: r.diagnostics.steps,
  };
}

function baselineTrajectory(): Run {
  const counter = { n: 0 };
  const s = new Solver(3);
  s.relativeTolerance = TOL;
  s.absoluteTolerance = ATOL;
  s.maxSteps = 1e7;
  s.denseOutput = true;
  const out: number[][] = [];
  const t0 = performance.now();
  const r = s.solve(
    naiveRhs(B.model, counter),
    0,
    Y0,
    HORIZON,
    s.grid(1, (_t, y) => void out.push(y)),
  );
  return { wallMs: performance.now() - t0, evals: counter.n, steps: r.nStep };
}

const sweepValues = Array.from({ length: 100 }, (_, i) => 2 + (4.2 * i) / 99);
const sweepModels = sweepValues.map((b1) =>
  withParameter(B.model, '/levels/1/handlingTime', b1 / 5),
);

function engineSweep(): Run {
  const window = Float64Array.from(
    { length: (HORIZON - TRANSIENT) / DT + 1 },
    (_, i) => TRANSIENT + i * DT,
  );
  const z = new Float64Array(window.length);
  const maxima: number[] = [];
  let evals = 0;
  let steps = 0;
  const t0 = performance.now();
  for (const model of sweepModels) {
    const r = integrateChain(compileChain(model), Y0, {
      t1: HORIZON,
      tolerance: TOL,
      absoluteTolerance: ATOL,
      sampleTimes: window,
      denseComponents: [2],
      onSample: (k, _t, y) => void (z[k] = y[2]!),
      wallTimeMs: 600_000,
    });
    evals += r.diagnostics.rhsEvaluations;
    steps += r.diagnostics.steps;
    maxima.push(countMaxima(z));
  }
  return { wallMs: performance.now() - t0, evals, steps, maxima };
}

function baselineSweep(): Run {
  const counter = { n: 0 };
  const maxima: number[] = [];
  let steps = 0;
  const t0 = performance.now();
  for (const model of sweepModels) {
    const s = new Solver(3);
    s.relativeTolerance = TOL;
    s.absoluteTolerance = ATOL;
    s.maxSteps = 1e7;
    s.denseOutput = true;
    const z: number[] = [];
    const r = s.solve(
      naiveRhs(model, counter),
      0,
      Y0,
      HORIZON,
      s.grid(DT, (t, y) => void (t >= TRANSIENT - 1e-9 && z.push(y[2]!))),
    );
    steps += r.nStep;
    maxima.push(countMaxima(z));
  }
  return { wallMs: performance.now() - t0, evals: counter.n, steps, maxima };
}

const fmt = (v: number, d = 0) =>
  v.toLocaleString('en-US', { maximumFractionDigits: d, minimumFractionDigits: d });

export async function run(): Promise<void> {
  // Warm both paths up, then time the (short) trajectory several times, interleaved, and keep
  // the median: one run is dominated by JIT compilation and by whatever else shares the CPU.
  for (let i = 0; i < 3; i++) {
    engineTrajectory();
    baselineTrajectory();
  }
  const eRuns: Run[] = [];
  const bRuns: Run[] = [];
  for (let i = 0; i < REPEATS; i++) {
    eRuns.push(engineTrajectory());
    bRuns.push(baselineTrajectory());
  }
  const median = (runs: Run[]): Run =>
    [...runs].sort((p, q) => p.wallMs - q.wallMs)[runs.length >> 1]!;
  const rows: string[][] = [];
  const add = (name: string, e: Run, b: Run) => {
    rows.push([
      name,
      fmt(e.wallMs, 1),
      fmt(e.evals),
      fmt((e.wallMs * 1e6) / e.evals, 0),
      fmt(b.wallMs, 1),
      fmt(b.evals),
      fmt((b.wallMs * 1e6) / b.evals, 0),
      `${fmt(b.wallMs / e.wallMs, 2)}×`,
    ]);
  };
  add(`trajectory t=0..10000, b1=3 (median of ${REPEATS})`, median(eRuns), median(bRuns));
  const es = engineSweep();
  const bs = baselineSweep();
  add('sweep b1=2.0..6.2 ×100', es, bs);
  const head = [
    'workload (rtol 1e-8, odex)',
    'engine ms',
    'engine RHS',
    'ns/RHS',
    'baseline ms',
    'baseline RHS',
    'ns/RHS',
    'speed-up',
  ];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) =>
    cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join('  ');
  console.log(line(head));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) console.log(line(r));
  const agree = es.maxima!.filter((m, i) => m === bs.maxima![i]).length;
  console.log(`\nns/RHS = wall time per RHS evaluation, integrator overhead included.`);
  console.log(`Maxima of the top level per b1 (engine): ${es.maxima!.join(' ')}`);
  console.log(
    `Engine and baseline maxima counts agree at ${agree} of ${sweepValues.length} b1 values.`,
  );
}
