import { Piscina } from 'piscina';
import { ModelValidationError, type ValidationIssue } from '../model/validation-issue';
import { AnalysisRunError, extinctionThresholds, type RegimeReport } from '../regime/assess-regime';
import { AnalysisBoundsError } from '../analyses-contract/analysis-limits';
import type { RegimeRequest } from '../analyses-contract/regime-contract';
import type { RegimeMapRequest, SweepRequest } from '../analyses-contract/sweep-contract';
import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import type { ComparisonRequest } from '../analyses-contract/comparison-contract';
import { assertSweepBounds, sweepWork, type SweepRange } from '../sweep/run-sweep';
import {
  assembleRegimeMap,
  assertRegimeMapBounds,
  regimeMapWork,
  type RegimeMapCell,
} from '../sweep/run-regime-map';
import {
  assertEnsembleBounds,
  ensembleShape,
  ensembleWork,
} from '../ensemble/run-ensemble-members';
import {
  assembleEnsemble,
  bandColumnCount,
  BAND_PERCENTILES,
  type EnsembleResult,
} from '../ensemble/summarise-ensemble';
import { assertComparisonBounds, type ScenarioOutcome } from '../compare/compare-scenarios';
import type { SweepPoint } from '../sweep/sweep-point';
import type { AnalysisTask, TaskFailure } from './analysis-task';
import { chunkCount, planChunks } from './plan-chunks';
import { FairScheduler, type RunPriority } from './fair-scheduler';
import { WORKER_NICENESS } from './thread-priority';

/** Progress, cancellation and scheduling of one analysis run. */
export interface AnalysisRunOptions {
  /** Called with the fraction done (0..1) each time a chunk of items finishes. */
  readonly onProgress?: (fraction: number) => void;
  /** Aborting it cancels queued and running work; the promise rejects with an AbortError. */
  readonly signal?: AbortSignal;
  /** Whose run it is (the server passes the tenant): owners' chunks take turns. Default "". */
  readonly owner?: string;
  /**
   * `interactive` (a caller waits on the answer) goes before any `batch` run's next chunk.
   * Default `batch`, except `runRegime` (a synchronous request), which defaults to interactive.
   */
  readonly priority?: RunPriority;
}

/** A sweep's result with integrator counters. */
export interface SweepResult {
  readonly points: SweepPoint[];
  readonly diagnostics: { readonly steps: number; readonly rhsEvaluations: number };
}

/** A regime map's result (`cells[yIndex][xIndex]`). */
export type RegimeMapResult = ReturnType<typeof assembleRegimeMap>;

/** A comparison's result: the baseline first, then the alternatives in request order. */
export interface ComparisonResult {
  readonly thresholds: Record<string, number>;
  readonly scenarios: ScenarioOutcome[];
}

/** The worker pool the server runs analyses on. */
export interface AnalysisPool {
  /** Number of worker threads. */
  readonly size: number;
  /** Bifurcation diagram; points in value order whatever the pool size. */
  runSweep(req: SweepRequest, options?: AnalysisRunOptions): Promise<SweepResult>;
  /** Regime map over two parameters. */
  runRegimeMap(req: RegimeMapRequest, options?: AnalysisRunOptions): Promise<RegimeMapResult>;
  /** Monte Carlo ensemble; identical bit for bit for a given seed whatever the pool size. */
  runEnsemble(req: EnsembleRequest, options?: AnalysisRunOptions): Promise<EnsembleResult>;
  /** Baseline against up to five alternatives. */
  runComparison(req: ComparisonRequest, options?: AnalysisRunOptions): Promise<ComparisonResult>;
  /** One regime assessment off the request thread. */
  runRegime(req: RegimeRequest, options?: AnalysisRunOptions): Promise<RegimeReport>;
  /** Stops the workers (waits for running tasks). */
  close(): Promise<void>;
}

/** Options of {@link createAnalysisPool}. */
export interface AnalysisPoolOptions {
  /** Worker threads, 1..64. */
  readonly size: number;
  /** Fewest chunks per worker a run is cut into (finer: smoother progress and balance); default 4. */
  readonly chunksPerWorker?: number;
  /**
   * Nice value the worker threads lower themselves to (Linux; elsewhere ignored), so a busy pool
   * yields a core to the request thread the moment it needs one; default {@link WORKER_NICENESS}
   * (10), 0 leaves them be.
   */
  readonly niceness?: number;
}

const WORKER_FILE = new URL('./analysis-worker.mjs', import.meta.url).href;

/** A run's chunks and the items (indices) each holds: results go back by them. */
interface Plan {
  readonly tasks: AnalysisTask[];
  readonly items: readonly (readonly number[])[];
}

/** A plan of one task per item (scenarios, a regime). */
const single = (tasks: AnalysisTask[]): Plan => ({ tasks, items: tasks.map((_, i) => [i]) });

/**
 * Share of an ensemble's progress its members take; the bands take the rest. Measured on the
 * benchmark ensemble (1000 members, 101 samples): the percentiles cost about 6 % of the CPU.
 */
const MEMBERS_SHARE = 0.95;

/**
 * Starts a piscina pool of `size` workers for the analyses. Items (sweep values, map cells,
 * ensemble members, scenarios) are cut into interleaved chunks of bounded work, handed one at a
 * time to whichever worker is free by a {@link FairScheduler} (interactive runs first, owners in
 * turn), and reassembled by index; each item is computed independently (ensemble members from
 * their own random streams), so a request gives the same result whatever the pool size. Bounds
 * are checked before any work.
 */
export function createAnalysisPool(options: AnalysisPoolOptions): AnalysisPool {
  const size = options.size;
  if (!(Number.isInteger(size) && size >= 1 && size <= 64)) {
    throw new RangeError('size must be an integer in 1..64');
  }
  const perWorker = options.chunksPerWorker ?? 4;
  const piscina = new Piscina({
    filename: WORKER_FILE,
    minThreads: size,
    maxThreads: size,
    idleTimeout: 60_000,
    workerData: { niceness: options.niceness ?? WORKER_NICENESS },
  });
  // One chunk per worker at a time: what waits, waits here, where turns are kept.
  const scheduler = new FairScheduler<AnalysisTask>(size, (task, signal) =>
    piscina.run(task, { signal: signal ?? null }),
  );

  /** Runs a plan's chunks; progress goes from `from` to `from + span` as items finish. */
  async function runTasks<R>(
    plan: Plan,
    o: AnalysisRunOptions,
    priority: RunPriority,
    { from, span } = { from: 0, span: 1 },
  ) {
    o.signal?.throwIfAborted();
    const total = plan.items.reduce((a, c) => a + c.length, 0);
    let done = 0;
    if (from === 0) o.onProgress?.(0);
    const results = await scheduler.run(
      { owner: o.owner ?? '', priority: o.priority ?? priority },
      plan.tasks,
      {
        signal: o.signal,
        onEach: (i, r) => {
          if (isFailure(r)) throw rehydrate(r);
          done += plan.items[i]!.length;
          o.onProgress?.(from + (span * done) / total);
        },
      },
    );
    return results as R[];
  }

  const chunked = <T extends 'sweep' | 'map' | 'ensemble'>(
    kind: T,
    request: unknown,
    items: number,
    work: number,
    extra: object = {},
  ): Plan => {
    const chunks = planChunks(items, chunkCount(items, work, size, perWorker));
    return {
      tasks: chunks.map((c) => ({ kind, request, items: c, ...extra }) as AnalysisTask),
      items: chunks,
    };
  };

  return {
    size,
    async runSweep(req, o = {}) {
      assertSweepBounds(req);
      // A continued sweep carries state from value to value, so it is one ordered task.
      const all = Array.from({ length: req.steps }, (_, i) => i);
      const plan: Plan = req.continuation
        ? { tasks: [{ kind: 'sweep', request: req, items: all }], items: [all] }
        : chunked('sweep', req, req.steps, sweepWork(req));
      const parts = await runTasks<SweepRange>(plan, o, 'batch');
      const points: SweepPoint[] = new Array<SweepPoint>(req.steps);
      plan.items.forEach((c, j) => c.forEach((i, k) => (points[i] = parts[j]!.points[k]!)));
      return {
        points,
        diagnostics: {
          steps: parts.reduce((a, p) => a + p.steps, 0),
          rhsEvaluations: parts.reduce((a, p) => a + p.evaluations, 0),
        },
      };
    },
    async runRegimeMap(req, o = {}) {
      assertRegimeMapBounds(req);
      const cells = req.x.steps * req.y.steps;
      const plan = chunked('map', req, cells, regimeMapWork(req));
      const parts = await runTasks<RegimeMapCell[]>(plan, o, 'batch');
      const flat = new Array<RegimeMapCell>(cells);
      plan.items.forEach((c, j) => c.forEach((i, k) => (flat[i] = parts[j]![k]!)));
      return assembleRegimeMap(req, flat);
    },
    async runEnsemble(req, o = {}) {
      assertEnsembleBounds(req);
      // Workers write their members straight into shared buffers at the members' indices, so
      // nothing is copied back or merged here; then the percentiles, which need every member,
      // are computed in the workers too, a block of columns each (any split, same numbers).
      const { S, n } = ensembleShape(req);
      const B = Float64Array.BYTES_PER_ELEMENT;
      const series = new SharedArrayBuffer(req.members * S * n * B);
      const crossings = new SharedArrayBuffer(req.members * n * B);
      const members = chunked('ensemble', req, req.members, ensembleWork(req), {
        series,
        crossings,
      });
      await runTasks(members, o, 'batch', { from: 0, span: MEMBERS_SHARE });
      const columns = bandColumnCount(req);
      const ranges = planRanges(columns, size * BAND_CHUNKS_PER_WORKER);
      const bands: Plan = {
        tasks: ranges.map(([from, to]) => ({ kind: 'bands', request: req, series, from, to })),
        items: ranges.map(([from, to]) => Array.from({ length: to - from }, (_, k) => from + k)),
      };
      const parts = await runTasks<Float64Array>(bands, o, 'batch', {
        from: MEMBERS_SHARE,
        span: 1 - MEMBERS_SHARE,
      });
      const quantiles = new Float64Array(columns * BAND_PERCENTILES.length);
      ranges.forEach(([from], j) => quantiles.set(parts[j]!, from * BAND_PERCENTILES.length));
      return assembleEnsemble(req, quantiles, new Float64Array(crossings));
    },
    async runComparison(req, o = {}) {
      assertComparisonBounds(req);
      const tasks = Array.from(
        { length: req.scenarios.length + 1 },
        (_, index) => ({ kind: 'scenario', request: req, index }) as AnalysisTask,
      );
      const scenarios = await runTasks<ScenarioOutcome>(single(tasks), o, 'batch');
      const thresholds: Record<string, number> = {};
      const thr = extinctionThresholds(req.model, req.thresholds);
      req.model.levels.forEach((l, i) => (thresholds[l.id] = thr[i]!));
      return { thresholds, scenarios };
    },
    async runRegime(req, o = {}) {
      const plan = single([{ kind: 'regime', request: req }]);
      const [report] = await runTasks<RegimeReport>(plan, o, 'interactive');
      return report!;
    },
    close: () => piscina.close(),
  };
}

/** Band chunks per worker: a column costs about 0.1 ms, so a few blocks balance the workers. */
const BAND_CHUNKS_PER_WORKER = 2;

/** [from, to) ranges cutting [0, total) into `parts` near-equal contiguous blocks. */
function planRanges(total: number, parts: number): [number, number][] {
  const k = Math.max(1, Math.min(total, parts));
  return Array.from({ length: k }, (_, c) => [
    Math.floor((c * total) / k),
    Math.floor(((c + 1) * total) / k),
  ]);
}

function isFailure(r: unknown): r is TaskFailure {
  return typeof r === 'object' && r !== null && (r as { failed?: unknown }).failed === true;
}

/** Restores the typed errors the server maps to problem details. */
function rehydrate(f: TaskFailure): Error {
  const d = f.details;
  if (Array.isArray(d['errors'])) return new ModelValidationError(d['errors'] as ValidationIssue[]);
  if (f.name === 'AnalysisRunError') return new AnalysisRunError(String(d['outcome']));
  if (f.name === 'AnalysisBoundsError') {
    const b = d as unknown as AnalysisBoundsError;
    return new AnalysisBoundsError(b.bound, b.pointer, b.requested, b.limit);
  }
  const e = new Error(f.message);
  e.name = f.name;
  return e;
}
