import { levelScales } from '../model/chain-kernel';
import { specialiseChain } from '../sweep/specialise-chain';
import type { ChainModel } from '../model/chain-model';
import { initialVector } from '../model/initial-vector';
import { withParameter } from '../model/parameter-pointer';
import { ModelValidationError, parsePointer } from '../model/validation-issue';
import { assessKernel, extinctionThresholds } from '../regime/assess-regime';
import { ensembleTimes } from '../ensemble/run-ensemble-members';
import {
  WORK_WEIGHT,
  ANALYSIS_LIMITS as L,
  assertBound,
} from '../analyses-contract/analysis-limits';
import type { ComparisonRequest } from '../analyses-contract/comparison-contract';
import { trackScenarioLevels, type LevelSummary } from './scenario-levels';

/** One scenario's outcome. */
export interface ScenarioOutcome {
  readonly name: string;
  readonly changes: readonly { readonly pointer: string; readonly value: number }[];
  readonly levels: Record<string, LevelSummary>;
  readonly regime: ReturnType<typeof assessKernel>['report']['regime'];
  readonly lyapunovExponent: { readonly value: number; readonly standardError: number };
  readonly times: number[];
  readonly series: Record<string, number[]>;
}

/** Weighted time units of a comparison. */
export function comparisonWork(req: ComparisonRequest): number {
  const per = req.horizon + (req.regimeTransient + req.regimeWindow) * WORK_WEIGHT.exponent;
  return (req.scenarios.length + 1) * per;
}

/** Throws AnalysisBoundsError when the comparison is too large; call before any work. */
export function assertComparisonBounds(req: ComparisonRequest): void {
  assertBound('alternatives', '/scenarios', req.scenarios.length, L.maxAlternatives);
  assertBound('work', '/horizon', comparisonWork(req), L.maxWork);
}

/** Applies a scenario's changes to the baseline; never mutates it. */
export function applyChanges(
  model: ChainModel,
  initial: Readonly<Record<string, number>>,
  changes: ComparisonRequest['scenarios'][number]['changes'],
): { model: ChainModel; initial: Record<string, number> } {
  let m = model;
  const init: Record<string, number> = { ...initial };
  for (const c of changes) {
    const tokens = parsePointer(c.pointer) ?? [];
    if (tokens[0] === 'initial' && tokens.length === 2) init[tokens[1]!] = c.value;
    else if (tokens[0] === 'model') m = withParameter(m, c.pointer.slice('/model'.length), c.value);
    else throw new ModelValidationError([{ pointer: c.pointer, message: 'not a change pointer' }]);
  }
  return { model: m, initial: init };
}

/**
 * Scenario `index` of a comparison (0 = baseline, k = alternative k-1): the trajectory to the
 * horizon with, per level, the value at the horizon, the mean over the final window (integrated
 * exactly as a quadrature alongside the state), the minimum and when it occurs (refined inside
 * steps from the dense output), the first time below the threshold; then the long-run regime.
 */
export function runScenario(req: ComparisonRequest, index: number): ScenarioOutcome {
  const scenario = index === 0 ? { name: 'baseline', changes: [] } : req.scenarios[index - 1]!;
  const { model, initial } = applyChanges(req.model, req.initial, scenario.changes);
  const kernel = specialiseChain(model);
  const y0 = initialVector(model, initial);
  const n = y0.length;
  const atol = req.tolerance * Math.min(...levelScales(model));
  const thresholds = thresholdVector(req);
  const times = ensembleTimes(req.horizon, req.samples);
  const track = trackScenarioLevels(kernel, y0, thresholds, times, req.horizon - req.window, {
    relativeTolerance: req.tolerance,
    absoluteTolerance: atol,
  });
  const { report } = assessKernel(kernel, y0, extinctionThresholds(model), {
    transient: req.regimeTransient,
    window: req.regimeWindow,
    tolerance: req.tolerance,
    absoluteTolerance: atol,
  });
  const levels: Record<string, LevelSummary> = {};
  const series: Record<string, number[]> = {};
  kernel.ids.forEach((id, i) => {
    levels[id] = track.levels[i]!;
    series[id] = times.map((_, s) => track.samples[s * n + i]!);
  });
  return {
    name: scenario.name,
    changes: scenario.changes,
    levels,
    regime: report.regime,
    lyapunovExponent: report.lyapunovExponent,
    times,
    series,
  };
}

/** Threshold per level: the request's, else the baseline's quasi-extinction default. */
export function thresholdVector(req: ComparisonRequest): Float64Array {
  return extinctionThresholds(req.model, req.thresholds);
}
