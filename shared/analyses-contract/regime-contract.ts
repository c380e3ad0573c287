import * as z from 'zod';
import type { ChainModel } from '../model/chain-model';
import type { ValidationResult } from '../model/validation-issue';
import type { RegimeOptions } from '../regime/assess-regime';
import {
  count,
  exponentField,
  finite,
  initialField,
  levelRefField,
  levelValuesField,
  regimeField,
  span,
  toleranceField,
} from './analysis-fields';
import { levelIdIssues, levelRecordIssues, validateAnalysisBody } from './validate-analysis-body';

/** Body of `POST /api/v1/regimes`: `{ model, initial, transient?, window?, … }`. */
export const regimeRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialField,
  transient: span('transient', true).optional(),
  window: span('window').optional(),
  tolerance: toleranceField.optional(),
  exponents: count('exponents', 1, 4).optional(),
  extinction: levelValuesField.optional(),
  initialUncertainty: finite('initialUncertainty').positive().max(1).optional(),
  uncertaintyTolerance: finite('uncertaintyTolerance').positive().max(100).optional(),
  observe: levelRefField.optional(),
});

/** Response of `POST /api/v1/regimes` (the contract's fields first, then the evidence). */
export const regimeResponseSchema = z.object({
  regime: regimeField,
  lyapunovExponent: exponentField,
  period: z.number().optional(),
  maximaPerPeriod: z.number().int().optional(),
  predictabilityHorizon: z.number().optional(),
  predictabilityNote: z.string().optional(),
  spectrum: z.object({ values: z.array(z.number()), standardErrors: z.array(z.number()) }),
  meanDivergence: z.number(),
  collapsedLevels: z.array(z.string()).optional(),
  regimeNote: z.string().optional(),
  diagnostics: z.object({ steps: z.number(), rhsEvaluations: z.number() }),
});

/** A validated regime request. */
export interface RegimeRequest extends RegimeOptions {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
}

/** Validates a regime request body; pointers relative to the body. */
export function validateRegimeRequest(input: unknown): ValidationResult<RegimeRequest> {
  const r = validateAnalysisBody(regimeRequestSchema, input, (b, model) => [
    ...levelRecordIssues(model, b.extinction, '/extinction'),
    ...(b.observe === undefined ? [] : levelIdIssues(model, b.observe, '/observe')),
    ...(b.exponents !== undefined && b.exponents > model.levels.length
      ? [{ pointer: '/exponents', message: `at most ${model.levels.length} for this model` }]
      : []),
  ]);
  if (!r.ok) return r;
  const { model: _m, initial, ...options } = r.value.body;
  return {
    ok: true,
    value: { ...options, model: r.value.model, initial: initial as Record<string, number> },
  };
}
