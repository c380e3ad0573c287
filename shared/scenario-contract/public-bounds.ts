import * as z from 'zod';
import type { ChainModel } from '../model/chain-model';
import { getParameter, withParameter } from '../model/parameter-pointer';
import type { ValidationIssue } from '../model/validation-issue';

/** Most parameters a published scenario lets the public change. */
export const MAX_PUBLIC_PARAMETERS = 12;

/**
 * One parameter the public may change on a portal, and its range: the shape the widgets'
 * parameter form reads (`ParameterBounds`).
 */
export const publicParameterSchema = z.strictObject({
  pointer: z.string({ error: 'pointer must be a JSON Pointer string' }),
  min: z.number({ error: 'min must be a finite number' }),
  max: z.number({ error: 'max must be a finite number' }),
  step: z.number().positive({ error: 'step must be greater than zero' }).optional(),
  label: z.string().trim().min(1).max(120).optional(),
});

/** One public parameter. */
export type PublicParameter = z.infer<typeof publicParameterSchema>;

/**
 * Checks public ranges against the model's own bounds: each pointer names a parameter, each
 * range is non-empty, holds the published value, and both ends are values the model itself
 * accepts (so no what-if within the range can be refused as an invalid model).
 */
export function publicBoundsIssues(
  model: ChainModel,
  bounds: readonly PublicParameter[],
  prefix = '/publicParameters',
): ValidationIssue[] {
  const out: ValidationIssue[] = [];
  const seen = new Set<string>();
  bounds.forEach((b, i) => {
    const at = `${prefix}/${i}`;
    if (seen.has(b.pointer)) out.push({ pointer: `${at}/pointer`, message: 'listed twice' });
    seen.add(b.pointer);
    let value: number;
    try {
      value = getParameter(model, b.pointer);
    } catch {
      out.push({ pointer: `${at}/pointer`, message: `"${b.pointer}" names no model parameter` });
      return;
    }
    if (!(b.min < b.max)) out.push({ pointer: `${at}/max`, message: 'max must exceed min' });
    for (const end of ['min', 'max'] as const) {
      try {
        withParameter(model, b.pointer, b[end]);
      } catch (err) {
        const why = (err as { errors?: ValidationIssue[] }).errors?.[0]?.message ?? 'invalid';
        out.push({ pointer: `${at}/${end}`, message: `outside the model's own bounds: ${why}` });
      }
    }
    if (b.min < b.max && (value < b.min || value > b.max)) {
      out.push({
        pointer: `${at}/min`,
        message: `the range must hold the published value ${value}`,
      });
    }
  });
  return out;
}

/** One public what-if: a listed pointer and the value asked for. */
export const whatIfChangeSchema = z.strictObject({
  pointer: z.string({ error: 'pointer must be a JSON Pointer string' }),
  value: z.number({ error: 'value must be a finite number' }),
});

/**
 * Issues of what-if changes against a published scenario's ranges: only listed parameters,
 * only within their range. Pointers relative to the body (`/changes/0/value`).
 */
export function whatIfIssues(
  bounds: readonly PublicParameter[],
  changes: readonly z.infer<typeof whatIfChangeSchema>[],
): ValidationIssue[] {
  const byPointer = new Map(bounds.map((b) => [b.pointer, b]));
  const out: ValidationIssue[] = [];
  changes.forEach((c, i) => {
    const b = byPointer.get(c.pointer);
    if (!b) {
      out.push({
        pointer: `/changes/${i}/pointer`,
        message: `the publisher does not let the public change "${c.pointer}"`,
      });
    } else if (c.value < b.min || c.value > b.max) {
      out.push({
        pointer: `/changes/${i}/value`,
        message: `must be between ${b.min} and ${b.max}, the publisher's range`,
      });
    }
  });
  return out;
}
