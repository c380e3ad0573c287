import { chainModelSchema, type ChainModel } from './chain-model';
import { ModelValidationError, type ValidationResult } from './validation-issue';
import { issuesFromZod } from './zod-issues';

/**
 * Validates an unknown value as a chain model. Never throws; pointers are relative to the model
 * itself unless `prefix` says where it sits (e.g. `['model']` inside a request body).
 */
export function validateModel(
  input: unknown,
  prefix: readonly (string | number)[] = [],
): ValidationResult<ChainModel> {
  const parsed = chainModelSchema.safeParse(input);
  return parsed.success
    ? { ok: true, value: parsed.data }
    : { ok: false, errors: issuesFromZod(parsed.error, prefix) };
}

/** Like {@link validateModel} but throws a {@link ModelValidationError} on bad input. */
export function parseModel(input: unknown): ChainModel {
  const result = validateModel(input);
  if (!result.ok) throw new ModelValidationError(result.errors);
  return result.value;
}
