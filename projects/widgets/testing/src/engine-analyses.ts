// The engine's analyses are not yet listed in @tropline/core's index (the analyses work appends
// them there), so this adapter reaches them by module path and is not part of the published
// testing entry: the library's own stories and specs pass it to the fake client. Once the index
// lists them, these imports become `@tropline/core` and the fake uses it by default.
import { validateComparisonRequest } from '@tropline/core/analyses-contract/comparison-contract';
import { validateRegimeRequest } from '@tropline/core/analyses-contract/regime-contract';
import { validateSweepRequest } from '@tropline/core/analyses-contract/sweep-contract';
import { runScenario, thresholdVector } from '@tropline/core/compare/compare-scenarios';
import { assessRegime } from '@tropline/core/regime/assess-regime';
import { runSweepRange } from '@tropline/core/sweep/run-sweep';
import { ModelValidationError, type ValidationResult } from '@tropline/core';
import type { ComparisonResult, ScenarioOutcome, SweepPoint } from '@tropline/widgets';
import type { AnalysisSteps, FakeAnalyses } from './fake-tropline-client';

function validated<T>(result: ValidationResult<T>): T {
  if (!result.ok) throw new ModelValidationError(result.errors);
  return result.value;
}

/** The regime answer of `POST /regimes`, computed with the engine. */
function regime(body: unknown) {
  const req = validated(validateRegimeRequest(body));
  return assessRegime(req.model, req.initial, req);
}

/** A sweep split into one step per parameter value. */
function sweep(body: unknown): AnalysisSteps<{ points: SweepPoint[] }> {
  const req = validated(validateSweepRequest(body));
  const points: SweepPoint[] = [];
  return {
    count: req.steps,
    run: (i) => points.push(...runSweepRange(req, i, i + 1).points),
    result: () => ({ points }),
  };
}

/** A comparison split into one step per scenario (the baseline first). */
function comparison(body: unknown): AnalysisSteps<ComparisonResult> {
  const req = validated(validateComparisonRequest(body));
  const scenarios: ScenarioOutcome[] = [];
  const thr = thresholdVector(req);
  const thresholds: Record<string, number> = {};
  req.model.levels.forEach((l, i) => (thresholds[l.id] = thr[i]!));
  return {
    count: req.scenarios.length + 1,
    run: (i) => scenarios.push(runScenario(req, i)),
    result: () => ({ thresholds, scenarios }),
  };
}

/** The engine's regime, sweep and comparison for the fake client. */
export const ENGINE_ANALYSES: FakeAnalyses = { regime, sweep, comparison };
