import * as z from 'zod';
import { ENGINE_LIMITS } from '../contract/limits';

const MAX = ENGINE_LIMITS.maxParameterMagnitude;

/** A finite number field with plain messages: `required`, `must be a finite number`, bounds. */
function numberField(label: string, bound: 'positive' | 'nonnegative') {
  const base = z
    .number({
      error: (iss) =>
        iss.input === undefined ? `${label} is required` : `${label} must be a finite number`,
    })
    .max(MAX, { error: `${label} must be at most ${MAX}` });
  return bound === 'positive'
    ? base.positive({ error: `${label} must be greater than zero` })
    : base.nonnegative({ error: `${label} must not be negative` });
}

function labelField(label: string) {
  return z
    .string({
      error: (iss) =>
        iss.input === undefined ? `${label} is required` : `${label} must be a string`,
    })
    .trim()
    .min(1, { error: `${label} must not be empty` })
    .max(ENGINE_LIMITS.maxLabelLength, {
      error: `${label} must be at most ${ENGINE_LIMITS.maxLabelLength} characters`,
    });
}

function levelObjectError(iss: { input: unknown }): string {
  return iss.input === undefined
    ? 'a level is required here (a chain has 2 to 4 levels, the producer first)'
    : 'a level must be an object';
}

/** A level id: a lowercase slug (`a-z`, `0-9`, single hyphens), unique within the model. */
export const levelIdSchema = z
  .string({ error: (iss) => (iss.input === undefined ? 'id is required' : 'id must be a string') })
  .max(ENGINE_LIMITS.maxIdLength, {
    error: `id must be at most ${ENGINE_LIMITS.maxIdLength} characters`,
  })
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, {
    error: 'id must be a lowercase slug (letters, digits, single hyphens), e.g. "zooplankton"',
  });

/** Level 0: the producer, growing logistically. */
export const producerLevelSchema = z.strictObject(
  {
    id: levelIdSchema,
    name: labelField('name'),
    unit: labelField('unit'),
    /** Intrinsic growth rate r, per model time unit. */
    growthRate: numberField('growthRate', 'positive'),
    /** Carrying capacity K, in the level's unit. */
    carryingCapacity: numberField('carryingCapacity', 'positive'),
  },
  { error: levelObjectError },
);

/** Level j ≥ 1: a consumer eating level j-1 with a Holling type II (or III) response. */
export const consumerLevelSchema = z.strictObject(
  {
    id: levelIdSchema,
    name: labelField('name'),
    unit: labelField('unit'),
    /** Attack rate a (per prey unit per time unit for type II). */
    attackRate: numberField('attackRate', 'positive'),
    /** Handling time h, in model time units; 0 gives a linear (type I) response. */
    handlingTime: numberField('handlingTime', 'nonnegative'),
    /** Conversion efficiency e: consumer units gained per prey unit eaten. */
    efficiency: numberField('efficiency', 'positive'),
    /** Per-capita mortality m, per model time unit. */
    mortality: numberField('mortality', 'nonnegative'),
    /** Functional response; absent means `"type2"`. */
    response: z
      .enum(['type2', 'type3'], { error: 'response must be "type2" or "type3"' })
      .optional(),
  },
  { error: levelObjectError },
);

/** Harvest of one level: proportional effort `F·N`, or a quota `H` that tapers near zero. */
export const harvestRuleSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      level: levelIdSchema,
      kind: z.literal('effort'),
      /** Harvest rate F per time unit (the harvest is F·N). */
      rate: numberField('rate', 'nonnegative'),
    }),
    z.strictObject({
      level: levelIdSchema,
      kind: z.literal('quota'),
      /** Quota H in the level's unit per time unit, tapered smoothly to zero as N → 0. */
      amount: numberField('amount', 'nonnegative'),
    }),
  ],
  { error: 'harvest kind must be "effort" or "quota"' },
);

/** Constant stocking of one level, in the level's unit per time unit. */
export const stockingRuleSchema = z.strictObject({
  level: levelIdSchema,
  amount: numberField('amount', 'nonnegative'),
});

/**
 * The food-chain model exactly as the API contract writes it: 2–4 levels (level 0 the producer),
 * a time unit, optional harvest and stocking rules that name levels by id.
 */
export const chainModelSchema = z
  .strictObject({
    timeUnit: labelField('timeUnit'),
    levels: z.tuple([producerLevelSchema], consumerLevelSchema, {
      error: (iss) =>
        iss.input === undefined ? 'levels is required' : 'levels must be an array of 2 to 4 levels',
    }),
    harvest: z.array(harvestRuleSchema, { error: 'harvest must be an array' }).optional(),
    stocking: z.array(stockingRuleSchema, { error: 'stocking must be an array' }).optional(),
  })
  .superRefine((model, ctx) => {
    const n = model.levels.length;
    if (n < ENGINE_LIMITS.minLevels || n > ENGINE_LIMITS.maxLevels) {
      ctx.addIssue({
        code: 'custom',
        path: ['levels'],
        message: `a chain has ${ENGINE_LIMITS.minLevels} to ${ENGINE_LIMITS.maxLevels} levels, not ${n}`,
      });
    }
    const seen = new Set<string>();
    model.levels.forEach((level, i) => {
      if (seen.has(level.id)) {
        ctx.addIssue({
          code: 'custom',
          path: ['levels', i, 'id'],
          message: `duplicate level id "${level.id}"`,
        });
      }
      seen.add(level.id);
    });
    for (const key of ['harvest', 'stocking'] as const) {
      model[key]?.forEach((rule, i) => {
        if (!seen.has(rule.level)) {
          ctx.addIssue({
            code: 'custom',
            path: [key, i, 'level'],
            message: `unknown level id "${rule.level}"`,
          });
        }
      });
    }
  });

/** A validated food-chain model (the API contract's model JSON). */
export type ChainModel = z.infer<typeof chainModelSchema>;
/** Level 0 of a chain. */
export type ProducerLevel = z.infer<typeof producerLevelSchema>;
/** A consumer level (index ≥ 1). */
export type ConsumerLevel = z.infer<typeof consumerLevelSchema>;
/** One harvest rule. */
export type HarvestRule = z.infer<typeof harvestRuleSchema>;
/** One stocking rule. */
export type StockingRule = z.infer<typeof stockingRuleSchema>;
