import type { z } from 'zod';
import { issuesFromZod } from '@tropline/core';
import { validationProblem } from '../http/problem';

/** Parses a request body with its zod schema or throws a 400 naming each field. */
export function parseBody<T>(schema: z.ZodType<T>, body: unknown): T {
  const result = schema.safeParse(body ?? {});
  if (!result.success) throw validationProblem(issuesFromZod(result.error));
  return result.data;
}
