import { Piscina } from 'piscina';
import { ModelValidationError, type ValidationIssue } from '../model/validation-issue';
import { AnalysisRunError, extinctionThresholds, type RegimeReport } from '../regime/assess-regime';
import { AnalysisBoundsError } from '../analyses-contract/analysis-limits';
import type { RegimeRequest } from '../analyses-contract/regime-contract';
import type { RegimeMapRequest, SweepRequest } from '../analyses-contract/sweep-contract';
import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import type { ComparisonRequest } from '../analyses-contract/comparison-contract';
import { assertSweepBounds, type SweepRange } from '../sweep/run-sweep';
import {
  assembleRegimeMap,
  assertRegimeMapBounds,
  type RegimeMapCell,
} from '../sweep/run-regime-map';
import { assertEnsembleBounds, type EnsembleMembers } from '../ensemble/run-ensemble-members';
import { summariseEnsemble, type EnsembleResult } from '../ensemble/summarise-ensemble';
import { assertComparisonBounds, type ScenarioOutcome } from '../compare/compare-scenarios';
import type { SweepPoint } from '../sweep/sweep-point';
import type { AnalysisTask, TaskFailure } from './analysis-task';
import { planChunks } from './plan-chunks';

/** Progress and cancellation for one analysis run. */
export interface AnalysisRunOptions {
  /** Called with the fraction done (0..1) each time a chunk of items finishes. */
  readonly onProgress?: (fraction: number) => void;
  /** Aborting it cancels queued and running work; the promise rejects with an AbortError. */
  readonly signal?: AbortSignal;
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
  /** Chunks queued per worker (finer gives smoother progress and balance); default 4. */
  readonly chunksPerWorker?: number;
}

const WORKER_FILE = new URL('./analysis-worker.mjs', import.meta.url).href;

/**
 * Starts a piscina pool of `size` workers for the analyses. Items (sweep values, map cells,
 * ensemble members, scenarios) are split into chunks and results are reassembled by index, and
 * each item is computed independently (ensemble members from their own random streams), so a
 * request gives the same result whatever the pool size. Bounds are checked before any work.
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
  });

  async function runTasks<R>(tasks: AnalysisTask[], weights: number[], o: AnalysisRunOptions) {
    o.signal?.throwIfAborted();
    const total = weights.reduce((a, b) => a + b, 0);
    let done = 0;
    o.onProgress?.(0);
    const results = await Promise.all(
      tasks.map(async (task, i) => {
        const r = (await piscina.run(task, { signal: o.signal ?? null })) as R | TaskFailure;
        if (isFailure(r)) throw rehydrate(r);
        done += weights[i]!;
        o.onProgress?.(done / total);
        return r as R;
      }),
    );
    return results;
  }

  const ranged = <T extends 'sweep' | 'map' | 'ensemble'>(kind: T, request: unknown, n: number) => {
    const chunks = planChunks(n, size * perWorker);
    return {
      tasks: chunks.map(([start, end]) => ({ kind, request, start, end }) as AnalysisTask),
      weights: chunks.map(([start, end]) => end - start),
    };
  };

  return {
    size,
    async runSweep(req, o = {}) {
      assertSweepBounds(req);
      // A continued sweep carries state from value to value, so it is one ordered task.
      const plan = req.continuation
        ? {
            tasks: [{ kind: 'sweep', request: req, start: 0, end: req.steps } as AnalysisTask],
            weights: [1],
          }
        : ranged('sweep', req, req.steps);
      const parts = await runTasks<SweepRange>(plan.tasks, plan.weights, o);
      return {
        points: parts.flatMap((p) => p.points),
        diagnostics: {
          steps: parts.reduce((a, p) => a + p.steps, 0),
          rhsEvaluations: parts.reduce((a, p) => a + p.evaluations, 0),
        },
      };
    },
    async runRegimeMap(req, o = {}) {
      assertRegimeMapBounds(req);
      const plan = ranged('map', req, req.x.steps * req.y.steps);
      const parts = await runTasks<RegimeMapCell[]>(plan.tasks, plan.weights, o);
      return assembleRegimeMap(req, parts.flat());
    },
    async runEnsemble(req, o = {}) {
      assertEnsembleBounds(req);
      const plan = ranged('ensemble', req, req.members);
      const parts = await runTasks<EnsembleMembers>(plan.tasks, plan.weights, o);
      const series = new Float64Array(parts.reduce((a, p) => a + p.series.length, 0));
      const crossings = new Float64Array(parts.reduce((a, p) => a + p.crossings.length, 0));
      let s = 0;
      let c = 0;
      for (const p of parts) {
        series.set(p.series, s);
        crossings.set(p.crossings, c);
        s += p.series.length;
        c += p.crossings.length;
      }
      return summariseEnsemble(req, series, crossings);
    },
    async runComparison(req, o = {}) {
      assertComparisonBounds(req);
      const tasks = Array.from(
        { length: req.scenarios.length + 1 },
        (_, index) => ({ kind: 'scenario', request: req, index }) as AnalysisTask,
      );
      const scenarios = await runTasks<ScenarioOutcome>(
        tasks,
        tasks.map(() => 1),
        o,
      );
      const thresholds: Record<string, number> = {};
      const thr = extinctionThresholds(req.model, req.thresholds);
      req.model.levels.forEach((l, i) => (thresholds[l.id] = thr[i]!));
      return { thresholds, scenarios };
    },
    async runRegime(req, o = {}) {
      const [report] = await runTasks<RegimeReport>([{ kind: 'regime', request: req }], [1], o);
      return report!;
    },
    close: () => piscina.close(),
  };
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
