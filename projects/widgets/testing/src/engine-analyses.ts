// The engine's regime, sweep and comparison, run in the page for the fake client: stories,
// specs and host apps' tests get the numbers the API would give, with no server.
import {
  assessRegime,
  ModelValidationError,
  runScenario,
  runSweepRange,
  thresholdVector,
  validateComparisonRequest,
  validateRegimeRequest,
  validateSweepRequest,
  type ValidationResult,
} from '@tropline/core';
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
