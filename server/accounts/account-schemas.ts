import { z } from 'zod';
import { TENANT_ROLES } from '@tropline/core';
import { MAX_EMAIL_LENGTH } from './email-address';

const email = z
  .string({ error: 'email must be a string' })
  .min(1, { error: 'an e-mail address is required' })
  .max(MAX_EMAIL_LENGTH, { error: `email has at most ${MAX_EMAIL_LENGTH} characters` });
// Long enough for any policy-conforming password, short enough to bound argon2's input.
const password = z
  .string({ error: 'password must be a string' })
  .min(1, { error: 'a password is required' })
  .max(1024, { error: 'password has at most 1024 characters' });
const token = z
  .string({ error: 'token must be a string' })
  .min(1, { error: 'the token from the link is required' })
  .max(200, { error: 'token has at most 200 characters' });
const role = z.enum(TENANT_ROLES, { error: 'role must be owner, admin, analyst or viewer' });

/** `POST /session`. */
export const signInBody = z.strictObject({ email, password });

/** `POST /invitations`. */
export const inviteBody = z.strictObject({ email, role });

/** `POST /invitations/lookup`. */
export const lookupBody = z.strictObject({ token });

/** `POST /invitations/accept`: `name` only for newcomers. */
export const acceptBody = z.strictObject({
  token,
  password,
  name: z.string({ error: 'name must be a string' }).max(120).optional(),
});

/** `PATCH /members/{userId}`. */
export const roleBody = z.strictObject({ role });

/** `POST /password-resets`. */
export const resetRequestBody = z.strictObject({ email });

/** `POST /password-resets/complete`. */
export const resetCompleteBody = z.strictObject({ token, password });

/** `POST /tenants` (operator). */
export const createTenantBody = z.strictObject({
  slug: z.string({ error: 'slug must be a string' }).max(64),
  name: z.string({ error: 'name must be a string' }).max(200),
});

const count = (field: string) =>
  z
    .number({ error: `${field} must be a whole number` })
    .int({ error: `${field} must be a whole number` })
    .min(0, { error: `${field} must not be negative` })
    .optional();

/** `PUT /tenants/{slug}/plan` (operator): fields left out keep their value. */
export const planBody = z.strictObject({
  monthlyUnits: count('monthlyUnits'),
  perMinute: count('perMinute'),
  browserPerMinute: count('browserPerMinute'),
});
