import type { z } from 'zod';
import { formatPointer, type ValidationIssue } from './validation-issue';

/**
 * Turns zod issues into pointer + message pairs, each pointer prefixed by `prefix` (tokens of the
 * place the parsed value sits in, e.g. `['model']`). Unknown keys get one issue per key, pointing
 * at the key itself.
 */
export function issuesFromZod(
  error: z.ZodError,
  prefix: readonly (string | number)[] = [],
): ValidationIssue[] {
  const out: ValidationIssue[] = [];
  for (const issue of error.issues) {
    const path = [...prefix, ...issue.path.map((p) => (typeof p === 'symbol' ? String(p) : p))];
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        out.push({ pointer: formatPointer([...path, key]), message: `unknown field "${key}"` });
      }
      continue;
    }
    out.push({ pointer: formatPointer(path), message: issue.message });
  }
  return out;
}
