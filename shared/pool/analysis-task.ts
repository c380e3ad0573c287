import { assessRegime } from '../regime/assess-regime';
import type { RegimeRequest } from '../analyses-contract/regime-contract';
import type { RegimeMapRequest, SweepRequest } from '../analyses-contract/sweep-contract';
import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import type { ComparisonRequest } from '../analyses-contract/comparison-contract';
import { runSweepRange } from '../sweep/run-sweep';
import { runRegimeMapCells } from '../sweep/run-regime-map';
import { runEnsembleMembers } from '../ensemble/run-ensemble-members';
import { runScenario } from '../compare/compare-scenarios';

/** One unit of work for a pool worker: a range of items of one analysis. */
export type AnalysisTask =
  | {
      readonly kind: 'sweep';
      readonly request: SweepRequest;
      readonly start: number;
      readonly end: number;
    }
  | {
      readonly kind: 'map';
      readonly request: RegimeMapRequest;
      readonly start: number;
      readonly end: number;
    }
  | {
      readonly kind: 'ensemble';
      readonly request: EnsembleRequest;
      readonly start: number;
      readonly end: number;
    }
  | { readonly kind: 'scenario'; readonly request: ComparisonRequest; readonly index: number }
  | { readonly kind: 'regime'; readonly request: RegimeRequest };

/** An error as it crosses the worker boundary, so the parent can rethrow it with its type. */
export interface TaskFailure {
  readonly failed: true;
  readonly name: string;
  readonly message: string;
  readonly details: Record<string, unknown>;
}

/** Runs one task; errors are returned as a {@link TaskFailure}, never thrown across threads. */
export function runAnalysisTask(task: AnalysisTask): unknown {
  try {
    switch (task.kind) {
      case 'sweep':
        return runSweepRange(task.request, task.start, task.end);
      case 'map':
        return runRegimeMapCells(task.request, task.start, task.end);
      case 'ensemble':
        return runEnsembleMembers(task.request, task.start, task.end);
      case 'scenario':
        return runScenario(task.request, task.index);
      case 'regime':
        return assessRegime(task.request.model, task.request.initial, task.request);
    }
  } catch (e) {
    const err = e instanceof Error ? e : new Error(String(e));
    const details: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(err)) details[k] = v;
    return { failed: true, name: err.name, message: err.message, details } satisfies TaskFailure;
  }
}

export default runAnalysisTask;
