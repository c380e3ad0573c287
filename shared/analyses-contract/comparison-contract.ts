import * as z from 'zod';
import type { ChainModel } from '../model/chain-model';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';
import { parsePointer } from '../model/validation-issue';
import { ANALYSIS_LIMITS as L } from './analysis-limits';
import {
  count,
  exponentField,
  finite,
  initialField,
  levelValuesField,
  pointerField,
  regimeField,
  span,
  toleranceField,
} from './analysis-fields';
import { levelRecordIssues, parameterIssues, validateAnalysisBody } from './validate-analysis-body';

/** One change of a scenario: a pointer into `{ model, initial }` and its new value. */
export const scenarioChangeSchema = z.strictObject({
  pointer: pointerField,
  value: finite('value'),
});

/** A named set of changes against the baseline. */
export const scenarioSchema = z.strictObject({
  name: z.string().trim().min(1, { error: 'name must not be empty' }).max(120),
  changes: z
    .array(scenarioChangeSchema)
    .max(L.maxChanges, { error: `at most ${L.maxChanges} changes per scenario` }),
});

/**
 * Body of a comparison: the baseline `{ model, initial }` and up to five alternatives, each a
 * list of changes such as `{ "pointer": "/model/harvest/0/rate", "value": 0.05 }` or a
 * reintroduction `{ "pointer": "/initial/fish", "value": 0.5 }`, all over the same horizon.
 */
export const comparisonRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialField,
  horizon: span('horizon'),
  window: span('window'),
  samples: count('samples', 2, 2001).optional(),
  thresholds: levelValuesField.optional(),
  scenarios: z
    .array(scenarioSchema)
    .min(1, { error: 'give at least one alternative' })
    .max(L.maxAlternatives, { error: `at most ${L.maxAlternatives} alternatives` }),
  regimeTransient: span('regimeTransient', true).optional(),
  regimeWindow: span('regimeWindow').optional(),
  tolerance: toleranceField.optional(),
});

const levelSummary = z.object({
  atHorizon: z.number(),
  windowMean: z.number(),
  minimum: z.number(),
  minimumTime: z.number(),
  thresholdCrossing: z.number().nullable(),
});

/** A comparison's result: the baseline first, then the alternatives in request order. */
export const comparisonResultSchema = z.object({
  thresholds: z.record(z.string(), z.number()),
  scenarios: z.array(
    z.object({
      name: z.string(),
      changes: z.array(scenarioChangeSchema),
      levels: z.record(z.string(), levelSummary),
      regime: regimeField,
      lyapunovExponent: exponentField,
      times: z.array(z.number()),
      series: z.record(z.string(), z.array(z.number())),
    }),
  ),
});

/** A validated comparison request with defaults. */
export interface ComparisonRequest {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly horizon: number;
  readonly window: number;
  readonly samples: number;
  readonly thresholds?: Readonly<Record<string, number>>;
  readonly scenarios: readonly {
    readonly name: string;
    readonly changes: readonly { readonly pointer: string; readonly value: number }[];
  }[];
  readonly regimeTransient: number;
  readonly regimeWindow: number;
  readonly tolerance: number;
}

/** Problems of one change pointer (`/model/…` to a numeric parameter or `/initial/<id>`). */
function changeIssues(model: ChainModel, pointer: string, at: string): ValidationIssue[] {
  const tokens = parsePointer(pointer) ?? [];
  if (tokens[0] === 'model') {
    return parameterIssues(model, pointer.slice('/model'.length), at);
  }
  if (tokens[0] === 'initial' && tokens.length === 2) {
    return model.levels.some((l) => l.id === tokens[1])
      ? []
      : [{ pointer: at, message: `no level "${tokens[1]}" in the model` }];
  }
  return [{ pointer: at, message: 'must point into /model/… or at /initial/<level id>' }];
}

/** Validates a comparison request body; pointers relative to the body. */
export function validateComparisonRequest(input: unknown): ValidationResult<ComparisonRequest> {
  const r = validateAnalysisBody(comparisonRequestSchema, input, (b, model) => {
    const issues: ValidationIssue[] = [...levelRecordIssues(model, b.thresholds, '/thresholds')];
    if (b.window > b.horizon) {
      issues.push({ pointer: '/window', message: 'window must not exceed the horizon' });
    }
    b.scenarios.forEach((s, i) =>
      s.changes.forEach((c, j) =>
        issues.push(...changeIssues(model, c.pointer, `/scenarios/${i}/changes/${j}/pointer`)),
      ),
    );
    return issues;
  });
  if (!r.ok) return r;
  const b = r.value.body;
  return {
    ok: true,
    value: {
      ...b,
      model: r.value.model,
      initial: b.initial as Record<string, number>,
      samples: b.samples ?? 201,
      regimeTransient: b.regimeTransient ?? 5000,
      regimeWindow: b.regimeWindow ?? 5000,
      tolerance: b.tolerance ?? 1e-8,
    },
  };
}
