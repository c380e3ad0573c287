import * as z from 'zod';
import type { ChainModel } from '../model/chain-model';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';
import { ANALYSIS_LIMITS as L } from './analysis-limits';
import {
  count,
  exponentField,
  finite,
  initialField,
  levelRefField,
  levelValuesField,
  pointerField,
  regimeField,
  span,
  toleranceField,
} from './analysis-fields';
import {
  levelIdIssues,
  levelRecordIssues,
  parameterIssues,
  parameterValueIssues,
  validateAnalysisBody,
} from './validate-analysis-body';

/**
 * Body of `POST /api/v1/sweeps`: the contract's `{ model, initial, parameter, from, to, steps,
 * observe, transient, window }` plus options. `steps` is the number of parameter values, evenly
 * spaced from `from` to `to` inclusive.
 */
export const sweepRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialField,
  parameter: pointerField,
  from: finite('from'),
  to: finite('to'),
  steps: count('steps', 2, L.maxSweepSteps),
  observe: levelRefField,
  transient: span('transient', true),
  window: span('window'),
  tolerance: toleranceField.optional(),
  continuation: z.boolean({ error: 'continuation must be true or false' }).optional(),
  regimeMethod: z.enum(['maxima', 'lyapunov']).optional(),
  extinction: levelValuesField.optional(),
});

/** A sweep's result: `{ points: [{ value, maxima, regime, lyapunovExponent? }] }`. */
export const sweepResultSchema = z.object({
  points: z.array(
    z.object({
      value: z.number(),
      maxima: z.array(z.number()),
      regime: regimeField,
      lyapunovExponent: exponentField.optional(),
    }),
  ),
});

/** A validated sweep request with defaults filled in. */
export interface SweepRequest {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly parameter: string;
  readonly from: number;
  readonly to: number;
  readonly steps: number;
  readonly observe: string;
  readonly transient: number;
  readonly window: number;
  readonly tolerance: number;
  readonly continuation: boolean;
  readonly regimeMethod: 'maxima' | 'lyapunov';
  readonly extinction?: Readonly<Record<string, number>>;
}

/** One axis of a regime map. */
export const mapAxisSchema = z.strictObject({
  parameter: pointerField,
  from: finite('from'),
  to: finite('to'),
  steps: count('steps', 2, L.maxMapSide),
});

/** Body of a regime-map request: two axes; per cell the largest exponent and the regime. */
export const regimeMapRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialField,
  x: mapAxisSchema,
  y: mapAxisSchema,
  transient: span('transient', true),
  window: span('window'),
  tolerance: toleranceField.optional(),
  extinction: levelValuesField.optional(),
});

/** A regime map: `cells[j][i]` is the cell at y value j and x value i. */
export const regimeMapResultSchema = z.object({
  x: z.object({ parameter: z.string(), values: z.array(z.number()) }),
  y: z.object({ parameter: z.string(), values: z.array(z.number()) }),
  cells: z.array(z.array(z.object({ regime: regimeField, lyapunovExponent: exponentField }))),
});

/** A validated regime-map request. */
export interface RegimeMapRequest {
  readonly model: ChainModel;
  readonly initial: Readonly<Record<string, number>>;
  readonly x: {
    readonly parameter: string;
    readonly from: number;
    readonly to: number;
    readonly steps: number;
  };
  readonly y: {
    readonly parameter: string;
    readonly from: number;
    readonly to: number;
    readonly steps: number;
  };
  readonly transient: number;
  readonly window: number;
  readonly tolerance: number;
  readonly extinction?: Readonly<Record<string, number>>;
}

/** Validates a sweep request body; pointers relative to the body. */
export function validateSweepRequest(input: unknown): ValidationResult<SweepRequest> {
  const r = validateAnalysisBody(sweepRequestSchema, input, (b, model) => [
    ...parameterIssues(model, b.parameter, '/parameter'),
    ...parameterValueIssues(model, b.parameter, b.from, '/from'),
    ...parameterValueIssues(model, b.parameter, b.to, '/to'),
    ...levelIdIssues(model, b.observe, '/observe'),
    ...levelRecordIssues(model, b.extinction, '/extinction'),
  ]);
  if (!r.ok) return r;
  const b = r.value.body;
  return {
    ok: true,
    value: {
      ...b,
      model: r.value.model,
      initial: b.initial as Record<string, number>,
      tolerance: b.tolerance ?? 1e-8,
      continuation: b.continuation ?? false,
      regimeMethod: b.regimeMethod ?? 'maxima',
    },
  };
}

/** Validates a regime-map request body; pointers relative to the body. */
export function validateRegimeMapRequest(input: unknown): ValidationResult<RegimeMapRequest> {
  const r = validateAnalysisBody(regimeMapRequestSchema, input, (b, model) => {
    const issues: ValidationIssue[] = [
      ...parameterIssues(model, b.x.parameter, '/x/parameter'),
      ...parameterIssues(model, b.y.parameter, '/y/parameter'),
      ...(['x', 'y'] as const).flatMap((a) => [
        ...parameterValueIssues(model, b[a].parameter, b[a].from, `/${a}/from`),
        ...parameterValueIssues(model, b[a].parameter, b[a].to, `/${a}/to`),
      ]),
      ...levelRecordIssues(model, b.extinction, '/extinction'),
    ];
    if (b.x.steps * b.y.steps > L.maxMapCells) {
      issues.push({ pointer: '/y/steps', message: `a map has at most ${L.maxMapCells} cells` });
    }
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
      tolerance: b.tolerance ?? 1e-8,
    },
  };
}
