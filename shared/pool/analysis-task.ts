import { assessRegime } from '../regime/assess-regime';
import type { RegimeRequest } from '../analyses-contract/regime-contract';
import type { RegimeMapRequest, SweepRequest } from '../analyses-contract/sweep-contract';
import type { EnsembleRequest } from '../analyses-contract/ensemble-contract';
import type { ComparisonRequest } from '../analyses-contract/comparison-contract';
import { runSweepRange, type SweepRange } from '../sweep/run-sweep';
import { runRegimeMapCells } from '../sweep/run-regime-map';
import { writeEnsembleMembers } from '../ensemble/run-ensemble-members';
import { bandColumns } from '../ensemble/summarise-ensemble';
import { runScenario } from '../compare/compare-scenarios';

/**
 * One unit of work for a pool worker: some items of one analysis, by index (ascending; a
 * continued sweep's items are 0..steps-1 in order, since each value starts from the last).
 */
export type AnalysisTask =
  | { readonly kind: 'sweep'; readonly request: SweepRequest; readonly items: readonly number[] }
  | { readonly kind: 'map'; readonly request: RegimeMapRequest; readonly items: readonly number[] }
  | {
      readonly kind: 'ensemble';
      readonly request: EnsembleRequest;
      readonly items: readonly number[];
      /** Member-major samples and crossing times of all members, shared with the caller. */
      readonly series: SharedArrayBuffer;
      readonly crossings: SharedArrayBuffer;
    }
  | {
      readonly kind: 'bands';
      readonly request: EnsembleRequest;
      readonly series: SharedArrayBuffer;
      /** Band columns [from, to), see `bandColumns`. */
      readonly from: number;
      readonly to: number;
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
        return task.request.continuation
          ? runSweepRange(task.request, task.items[0]!, task.items[task.items.length - 1]! + 1)
          : mergeSweepRanges(task.items.map((i) => runSweepRange(task.request, i, i + 1)));
      case 'map':
        return task.items.flatMap((i) => runRegimeMapCells(task.request, i, i + 1));
      case 'ensemble':
        return writeEnsembleMembers(
          task.request,
          task.items,
          new Float64Array(task.series),
          new Float64Array(task.crossings),
        );
      case 'bands':
        return bandColumns(task.request, new Float64Array(task.series), task.from, task.to);
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

/** One task's sweep points, in the order of its items, with the summed counters. */
function mergeSweepRanges(parts: SweepRange[]): SweepRange {
  return {
    points: parts.flatMap((p) => p.points),
    steps: parts.reduce((a, p) => a + p.steps, 0),
    evaluations: parts.reduce((a, p) => a + p.evaluations, 0),
  };
}

export default runAnalysisTask;
