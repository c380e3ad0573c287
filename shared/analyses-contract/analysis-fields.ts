import * as z from 'zod';
import { ANALYSIS_LIMITS as L } from './analysis-limits';

/** A finite number with plain messages. */
export function finite(label: string) {
  return z.number({
    error: (iss) =>
      iss.input === undefined ? `${label} is required` : `${label} must be a finite number`,
  });
}

/** A span of model time (transient, window, horizon): > 0 (or >= 0) and bounded. */
export function span(label: string, allowZero = false) {
  const base = finite(label).max(L.maxSpan, {
    error: `${label} must be at most ${L.maxSpan} time units`,
  });
  return allowZero
    ? base.nonnegative({ error: `${label} must not be negative` })
    : base.positive({ error: `${label} must be greater than zero` });
}

/** An integer count in [min, max]. */
export function count(label: string, min: number, max: number) {
  return finite(label)
    .int({ error: `${label} must be an integer` })
    .min(min, { error: `${label} must be at least ${min}` })
    .max(max, { error: `${label} must be at most ${max}` });
}

/** A relative tolerance for the analyses' integrator. */
export const toleranceField = finite('tolerance')
  .min(1e-12, { error: 'tolerance must be at least 1e-12' })
  .max(1e-4, { error: 'tolerance must be at most 1e-4' });

/** A JSON Pointer string (RFC 6901). */
export const pointerField = z
  .string({ error: 'must be a JSON Pointer string, e.g. "/levels/1/handlingTime"' })
  .regex(/^(\/([^~/]|~[01])*)+$/, {
    error: 'must be a JSON Pointer, e.g. "/levels/1/handlingTime"',
  });

/** Starting values by level id (checked against the model separately). */
export const initialField = z.record(z.string(), z.unknown(), {
  error: (iss) =>
    iss.input === undefined
      ? 'initial is required'
      : 'initial must be an object of level id → value',
});

/** Non-negative values by level id, e.g. quasi-extinction thresholds. */
export const levelValuesField = z.record(
  z.string(),
  finite('threshold').nonnegative({ error: 'threshold must not be negative' }),
);

/** A level id reference. */
export const levelRefField = z.string({ error: 'must be a level id' });

/** The four regimes. */
export const regimeField = z.enum(['equilibrium', 'cycle', 'chaotic', 'collapse']);

/** An exponent with its error. */
export const exponentField = z.object({ value: z.number(), standardError: z.number() });
