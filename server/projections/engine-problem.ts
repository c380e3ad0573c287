import {
  AnalysisBoundsError,
  AnalysisRunError,
  IntegrationError,
  ModelValidationError,
  ParameterPointerError,
} from '@tropline/core';
import { ProblemError, validationProblem } from '../http/problem';

const INTEGRATION_MESSAGES: Record<IntegrationError['code'], string> = {
  'step-limit': 'the integrator ran out of steps; shorten the horizon or loosen the tolerance',
  'time-limit': 'the computation ran out of wall time; shorten the horizon or loosen the tolerance',
  'blow-up': 'a level grew without bound; check the parameters of that level',
  'non-finite': 'a level became NaN or infinite; check the parameters of that level',
  'negative-level': 'a level went negative; check harvest quotas and the tolerance',
};

/**
 * Turns the engine's typed errors into problems that name a field: bad input is 400 with the
 * engine's pointers, a request too large is 422 naming the bound, and an integration that
 * cannot finish is 422 naming what to change. Anything else is rethrown (a real 500).
 */
export function engineProblem(err: unknown): ProblemError {
  if (err instanceof ProblemError) return err;
  if (err instanceof ModelValidationError) return validationProblem([...err.errors]);
  if (err instanceof ParameterPointerError) {
    return validationProblem([{ pointer: '/parameter', message: err.message }]);
  }
  if (err instanceof AnalysisBoundsError) {
    return new ProblemError(
      422,
      'too-large',
      'The request exceeds a bound',
      `${err.pointer}: asks for ${err.requested} (${err.bound}); the most allowed is ${err.limit}.`,
      {
        errors: [{ pointer: err.pointer, message: `at most ${err.limit} (${err.bound})` }],
        bound: err.bound,
        limit: err.limit,
      },
    );
  }
  if (err instanceof AnalysisRunError) {
    return new ProblemError(
      422,
      'integration-failed',
      'The model could not be integrated',
      `The analysis stopped: ${err.outcome}; shorten the spans or loosen the tolerance.`,
      {
        errors: [
          { pointer: '/window', message: `the integration did not finish (${err.outcome})` },
        ],
        cause: err.outcome,
      },
    );
  }
  if (err instanceof IntegrationError) {
    const levelPointer =
      err.levelIndex === undefined ? '/model' : `/model/levels/${err.levelIndex}`;
    const pointer =
      err.code === 'step-limit' || err.code === 'time-limit' ? '/horizon' : levelPointer;
    return new ProblemError(
      422,
      'integration-failed',
      'The model could not be integrated',
      `Stopped at t = ${err.time}: ${INTEGRATION_MESSAGES[err.code]}.`,
      {
        errors: [{ pointer, message: INTEGRATION_MESSAGES[err.code] }],
        cause: err.code,
        time: err.time,
        ...(err.levelId ? { level: err.levelId } : {}),
      },
    );
  }
  throw err;
}
