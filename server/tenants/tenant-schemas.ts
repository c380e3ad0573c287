import { z } from 'zod';
import { MAX_EMAIL_LENGTH } from '../accounts/email-address';

/** Plan offer ids are slugs like tenant slugs: `survey`, `field-station`. */
export const OFFER_ID = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

const name = (max: number) =>
  z
    .string({ error: 'name must be a string' })
    .trim()
    .min(1, { error: 'name must not be empty' })
    .max(max, { error: `name has at most ${max} characters` });
const description = z
  .string({ error: 'description must be a string' })
  .trim()
  .max(300, { error: 'description has at most 300 characters' });
const offerId = (field: string) =>
  z
    .string({ error: `${field} must be a string` })
    .max(40, { error: `${field} has at most 40 characters` })
    .regex(OFFER_ID, { error: `${field} is a lowercase slug such as "survey"` });
const count = (field: string, min: number) =>
  z
    .number({ error: `${field} must be a whole number` })
    .int({ error: `${field} must be a whole number` })
    .min(min, { error: `${field} must be at least ${min}` })
    .max(1_000_000_000, { error: `${field} must be at most 1000000000` });

/** `PATCH /tenant` (owner): fields left out stay as they are; `contactEmail: null` clears it. */
export const tenantChangeBody = z.strictObject({
  name: name(200).optional(),
  contactEmail: z
    .string({ error: 'contactEmail must be a string or null' })
    .max(MAX_EMAIL_LENGTH, { error: `contactEmail has at most ${MAX_EMAIL_LENGTH} characters` })
    .nullable()
    .optional(),
});

/** `PUT /tenant/plan` (owner): the offer to move to. */
export const planChoiceBody = z.strictObject({ offer: offerId('offer') });

/** `POST /plan-offers` (operator). */
export const createOfferBody = z.strictObject({
  id: offerId('id'),
  name: name(80),
  description: description.optional(),
  monthlyUnits: count('monthlyUnits', 0),
  perMinute: count('perMinute', 1),
  browserPerMinute: count('browserPerMinute', 0),
});

/** `PATCH /plan-offers/{id}` (operator): words and availability; the numbers never change. */
export const offerChangeBody = z.strictObject({
  name: name(80).optional(),
  description: description.optional(),
  available: z.boolean({ error: 'available must be true or false' }).optional(),
});
