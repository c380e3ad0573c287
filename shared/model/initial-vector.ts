import { ENGINE_LIMITS } from '../contract/limits';
import type { ChainModel } from './chain-model';
import { ModelValidationError, escapePointerToken, type ValidationIssue } from './validation-issue';

/**
 * Checks an initial state `{ [levelId]: number }` against the model: every level present, no
 * unknown ids, finite and non-negative values. Pointers are `/initial/<id>` (relative to a
 * request body) unless another prefix is given.
 */
export function initialStateIssues(
  model: ChainModel,
  initial: unknown,
  prefix = '/initial',
): ValidationIssue[] {
  if (initial === null || typeof initial !== 'object' || Array.isArray(initial)) {
    return [{ pointer: prefix, message: 'initial must be an object of level id → starting value' }];
  }
  const issues: ValidationIssue[] = [];
  const record = initial as Record<string, unknown>;
  const ids = new Set(model.levels.map((l) => l.id));
  for (const key of Object.keys(record)) {
    if (!ids.has(key))
      issues.push({
        pointer: `${prefix}/${escapePointerToken(key)}`,
        message: `unknown level id "${key}"`,
      });
  }
  for (const level of model.levels) {
    const p = `${prefix}/${escapePointerToken(level.id)}`;
    const v = record[level.id];
    if (v === undefined)
      issues.push({ pointer: p, message: `a starting value for "${level.id}" is required` });
    else if (typeof v !== 'number' || !Number.isFinite(v))
      issues.push({ pointer: p, message: 'must be a finite number' });
    else if (v < 0) issues.push({ pointer: p, message: 'must not be negative' });
    else if (v > ENGINE_LIMITS.maxParameterMagnitude)
      issues.push({
        pointer: p,
        message: `must be at most ${ENGINE_LIMITS.maxParameterMagnitude}`,
      });
  }
  return issues;
}

/**
 * Converts an initial state `{ [levelId]: number }` into a Float64Array in level order. Throws
 * {@link ModelValidationError} (pointers `/initial/<id>`) for missing, unknown, negative or
 * non-finite entries.
 */
export function initialVector(model: ChainModel, initial: Record<string, number>): Float64Array {
  const issues = initialStateIssues(model, initial);
  if (issues.length > 0) throw new ModelValidationError(issues);
  return Float64Array.from(model.levels, (l) => initial[l.id]!);
}

/** The inverse of {@link initialVector}: a state vector in level order → `{ [levelId]: value }`. */
export function stateRecord(model: ChainModel, y: ArrayLike<number>): Record<string, number> {
  const out: Record<string, number> = {};
  model.levels.forEach((l, i) => {
    out[l.id] = y[i]!;
  });
  return out;
}
