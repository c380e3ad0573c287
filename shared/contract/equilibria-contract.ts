import * as z from 'zod';
import { chainModelSchema, type ChainModel } from '../model/chain-model';
import { validateModel } from '../model/model-validation';
import type { ValidationResult } from '../model/validation-issue';

/**
 * zod schema of the equilibria request body (`POST /api/v1/equilibria`): `{ model }`. Validate
 * with {@link validateEquilibriaRequest} for body-relative pointers.
 */
export const equilibriaRequestSchema = z.strictObject({ model: chainModelSchema });

/** A validated equilibria request. */
export interface EquilibriaRequest {
  /** The chain model. */
  readonly model: ChainModel;
}

/** Validates an equilibria request body; pointers relative to the body (`/model/levels/0/…`). */
export function validateEquilibriaRequest(input: unknown): ValidationResult<EquilibriaRequest> {
  if (input === null || typeof input !== 'object' || Array.isArray(input)) {
    return {
      ok: false,
      errors: [{ pointer: '', message: 'the request body must be a JSON object' }],
    };
  }
  const extra = Object.keys(input).filter((k) => k !== 'model');
  const raw = (input as { model?: unknown }).model;
  const model = raw === undefined ? undefined : validateModel(raw, ['model']);
  const errors = [
    ...extra.map((k) => ({
      pointer: `/${k.replace(/~/g, '~0').replace(/\//g, '~1')}`,
      message: `unknown field "${k}"`,
    })),
    ...(model === undefined
      ? [{ pointer: '/model', message: 'model is required' }]
      : model.ok
        ? []
        : model.errors),
  ];
  if (errors.length > 0 || !model?.ok) return { ok: false, errors };
  return { ok: true, value: { model: model.value } };
}

/** zod schema of one eigenvalue. */
export const eigenvalueSchema = z.object({ re: z.number(), im: z.number() });

/** zod schema of one equilibrium in the response. */
export const equilibriumSchema = z.object({
  state: z.record(z.string(), z.number()),
  feasible: z.boolean(),
  eigenvalues: z.array(eigenvalueSchema),
  stable: z.boolean(),
  classification: z.enum([
    'stable node',
    'stable spiral',
    'unstable node',
    'unstable spiral',
    'saddle',
    'saddle focus',
    'non-hyperbolic',
  ]),
  description: z.string(),
  present: z.array(z.string()),
  kind: z.enum(['extinction', 'producer-only', 'partial-chain', 'interior']),
  method: z.enum(['closed-form', 'newton']),
});

/** zod schema of the equilibria response (`POST /api/v1/equilibria` → 200). */
export const equilibriaResponseSchema = z.object({ equilibria: z.array(equilibriumSchema) });

/** The equilibria response. */
export type EquilibriaResponse = z.infer<typeof equilibriaResponseSchema>;
