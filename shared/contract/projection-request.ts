import * as z from 'zod';
import { chainModelSchema, type ChainModel } from '../model/chain-model';
import { initialStateIssues } from '../model/initial-vector';
import { issuesFromZod } from '../model/zod-issues';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';
import { ENGINE_LIMITS as L } from './limits';

/** The initial state `{ [levelId]: number }`; checked against the model's ids after parsing. */
export const initialStateSchema = z.record(z.string(), z.unknown(), {
  error: (iss) =>
    iss.input === undefined
      ? 'initial is required'
      : 'initial must be an object of level id → starting value',
});

/**
 * The body of `POST /api/v1/projections`: `{ model, initial, horizon, samples?, tolerance? }`.
 * `initial` is typed loosely here; {@link validateProjectionRequest} checks it against the model.
 */
export const projectionRequestSchema = z.strictObject({
  model: z.unknown(),
  initial: initialStateSchema,
  horizon: z
    .number({
      error: (iss) =>
        iss.input === undefined ? 'horizon is required' : 'horizon must be a finite number',
    })
    .positive({ error: 'horizon must be greater than zero' })
    .max(L.maxHorizon, { error: `horizon must be at most ${L.maxHorizon} time units` }),
  samples: z
    .number({ error: 'samples must be an integer' })
    .int({ error: 'samples must be an integer' })
    .min(L.minSamples, { error: `samples must be at least ${L.minSamples}` })
    .max(L.maxSamples, { error: `samples must be at most ${L.maxSamples}` })
    .optional(),
  tolerance: z
    .number({ error: 'tolerance must be a finite number' })
    .min(L.minTolerance, { error: `tolerance must be at least ${L.minTolerance}` })
    .max(L.maxTolerance, { error: `tolerance must be at most ${L.maxTolerance}` })
    .optional(),
});

/**
 * The same body with the model's schema spelled out, for documentation (OpenAPI) and typing;
 * validation goes through {@link validateProjectionRequest}, which adds the checks that need the
 * model (initial ids) and precise pointers.
 */
export const projectionRequestBodySchema = projectionRequestSchema.extend({
  model: chainModelSchema,
  initial: z.record(z.string(), z.number()),
});

/** A validated projection request with defaults filled in. */
export interface ProjectionRequest {
  /** The chain model. */
  readonly model: ChainModel;
  /** Starting value of every level, by id. */
  readonly initial: Readonly<Record<string, number>>;
  /** End of the projection, in model time units (start is 0). */
  readonly horizon: number;
  /** Number of evenly spaced sample times from 0 to horizon inclusive. */
  readonly samples: number;
  /** Relative tolerance; the absolute floor matches it (scaled per level). */
  readonly tolerance: number;
}

/** What a caller may send: `samples` and `tolerance` optional. */
export type ProjectionRequestInput = Omit<ProjectionRequest, 'samples' | 'tolerance'> & {
  readonly samples?: number;
  readonly tolerance?: number;
};

/**
 * Validates a whole projection request body. Never throws; on failure every problem comes with
 * a pointer relative to the body (`/model/levels/1/attackRate`, `/initial/fish`, `/horizon`).
 */
export function validateProjectionRequest(input: unknown): ValidationResult<ProjectionRequest> {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) {
    return {
      ok: false,
      errors: [{ pointer: '', message: 'the request body must be a JSON object' }],
    };
  }
  const body = projectionRequestSchema.safeParse(input);
  const model = chainModelSchema.safeParse((input as { model?: unknown }).model);
  const errors: ValidationIssue[] = [];
  if (!body.success) {
    // The model is checked on its own below, with precise pointers.
    errors.push(...issuesFromZod(body.error).filter((i) => !i.pointer.startsWith('/model')));
  }
  if (!model.success) {
    const raw = (input as { model?: unknown }).model;
    errors.push(
      ...(raw === undefined
        ? [{ pointer: '/model', message: 'model is required' }]
        : issuesFromZod(model.error, ['model'])),
    );
  } else {
    const initial = (input as { initial?: unknown }).initial;
    if (initial !== undefined) errors.push(...initialStateIssues(model.data, initial, '/initial'));
  }
  if (errors.length > 0 || !body.success || !model.success) {
    return { ok: false, errors: dedupe(errors) };
  }
  return {
    ok: true,
    value: {
      model: model.data,
      initial: body.data.initial as Record<string, number>,
      horizon: body.data.horizon,
      samples: body.data.samples ?? L.defaultSamples,
      tolerance: body.data.tolerance ?? L.defaultTolerance,
    },
  };
}

function dedupe(issues: ValidationIssue[]): ValidationIssue[] {
  const seen = new Set<string>();
  return issues.filter((i) => {
    const key = `${i.pointer}\u0000${i.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
