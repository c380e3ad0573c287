import * as z from 'zod';

/** zod schema of the projection response (`POST /api/v1/projections` → 200). */
export const projectionResponseSchema = z.object({
  /** Sample times, evenly spaced from 0 to horizon inclusive. */
  times: z.array(z.number()),
  /** One series per level id, aligned with `times`. */
  series: z.record(z.string(), z.array(z.number())),
  /** Integrator counters. */
  diagnostics: z.object({
    steps: z.number().int(),
    accepted: z.number().int(),
    rejected: z.number().int(),
    rhsEvaluations: z.number().int(),
    tolerance: z.number(),
  }),
  /** Plain-language cautions to show beside the result. */
  cautions: z.array(z.string()),
});

/** The projection response. */
export type ProjectionResponse = z.infer<typeof projectionResponseSchema>;
