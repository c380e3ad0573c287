import type { z } from 'zod';
import { chainModelSchema, type ChainModel } from '../model/chain-model';
import { initialStateIssues } from '../model/initial-vector';
import { getParameter, withParameter } from '../model/parameter-pointer';
import { issuesFromZod } from '../model/zod-issues';
import type { ValidationIssue, ValidationResult } from '../model/validation-issue';

/** A parsed body with its validated model. */
export interface ParsedAnalysisBody<B> {
  readonly body: B;
  readonly model: ChainModel;
}

/**
 * Validates an analysis request body the way the engine validates projections: the body's own
 * fields by `schema` (whose `model` is `z.unknown()`), the model by the chain schema with
 * pointers under `/model`, `initial` against the model's level ids, then `semantic` checks that
 * need the model (parameter pointers, level ids). Never throws; every issue carries a pointer
 * relative to the body.
 */
export function validateAnalysisBody<B extends { initial?: unknown }>(
  schema: z.ZodType<B>,
  input: unknown,
  semantic: (body: B, model: ChainModel) => ValidationIssue[] = () => [],
): ValidationResult<ParsedAnalysisBody<B>> {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) {
    return {
      ok: false,
      errors: [{ pointer: '', message: 'the request body must be a JSON object' }],
    };
  }
  const raw = input as { model?: unknown; initial?: unknown };
  const body = schema.safeParse(input);
  const model = chainModelSchema.safeParse(raw.model);
  const errors: ValidationIssue[] = [];
  if (!body.success) {
    errors.push(...issuesFromZod(body.error).filter((i) => !i.pointer.startsWith('/model')));
  }
  if (!model.success) {
    errors.push(
      ...(raw.model === undefined
        ? [{ pointer: '/model', message: 'model is required' }]
        : issuesFromZod(model.error, ['model'])),
    );
  } else if (raw.initial !== undefined) {
    errors.push(...initialStateIssues(model.data, raw.initial, '/initial'));
  }
  if (body.success && model.success && errors.length === 0) {
    errors.push(...semantic(body.data, model.data));
  }
  if (errors.length > 0 || !body.success || !model.success)
    return { ok: false, errors: dedupe(errors) };
  return { ok: true, value: { body: body.data, model: model.data } };
}

/** An issue at `pointer` unless `parameter` names a numeric field of the model. */
export function parameterIssues(
  model: ChainModel,
  parameter: string,
  pointer: string,
): ValidationIssue[] {
  try {
    getParameter(model, parameter);
    return [];
  } catch (e) {
    return [{ pointer, message: (e as Error).message.replace(/^[^:]*: /, '') }];
  }
}

/**
 * Issues at `pointer` when setting the parameter to `value` makes the model invalid (e.g. a
 * negative rate); none when the parameter itself is bad (reported elsewhere).
 */
export function parameterValueIssues(
  model: ChainModel,
  parameter: string,
  value: number,
  pointer: string,
): ValidationIssue[] {
  if (parameterIssues(model, parameter, pointer).length > 0) return [];
  try {
    withParameter(model, parameter, value);
    return [];
  } catch (e) {
    const errors = (e as { errors?: readonly ValidationIssue[] }).errors;
    const why = errors?.[0]?.message ?? (e as Error).message;
    return [{ pointer, message: `gives an invalid model at ${parameter}: ${why}` }];
  }
}

/** An issue at `pointer` unless `id` is a level of the model. */
export function levelIdIssues(model: ChainModel, id: string, pointer: string): ValidationIssue[] {
  return model.levels.some((l) => l.id === id)
    ? []
    : [{ pointer, message: `no level "${id}" in the model` }];
}

/** Issues for keys of a per-level record that are not level ids. */
export function levelRecordIssues(
  model: ChainModel,
  record: Readonly<Record<string, unknown>> | undefined,
  pointer: string,
): ValidationIssue[] {
  if (!record) return [];
  return Object.keys(record).flatMap((id) => levelIdIssues(model, id, `${pointer}/${id}`));
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
