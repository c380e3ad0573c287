/**
 * @tropline/core: the engine and the contract. No Angular, no Express, no Knex.
 * Every public name is listed here one by one.
 */

/** Version of the engine package. */
export const CORE_VERSION = '0.1.0';

// ── Validation issues and JSON Pointers (RFC 6901) ──────────────────────────────────────────
export {
  /** Typed error carrying `errors: { pointer, message }[]`; the server maps it to RFC 9457. */
  ModelValidationError,
  /** Escapes one JSON Pointer reference token (`~` → `~0`, `/` → `~1`). */
  escapePointerToken,
  /** Builds a JSON Pointer from reference tokens. */
  formatPointer,
  /** Splits a JSON Pointer into unescaped tokens, or `undefined` if it is not one. */
  parsePointer,
} from './model/validation-issue';
export type {
  /** One problem with an input: `{ pointer, message }`. */
  ValidationIssue,
  /** `{ ok: true, value }` or `{ ok: false, errors }`. */
  ValidationResult,
} from './model/validation-issue';
export {
  /** Converts zod issues into pointer + message pairs under a prefix. */
  issuesFromZod,
} from './model/zod-issues';

// ── The model ───────────────────────────────────────────────────────────────────────────────
export {
  /** zod schema of the chain model, exactly the API contract's model JSON. */
  chainModelSchema,
  /** zod schema of a level id (lowercase slug). */
  levelIdSchema,
  /** zod schema of level 0 (logistic producer). */
  producerLevelSchema,
  /** zod schema of a consumer level (index ≥ 1). */
  consumerLevelSchema,
  /** zod schema of one harvest rule (effort or quota). */
  harvestRuleSchema,
  /** zod schema of one stocking rule. */
  stockingRuleSchema,
} from './model/chain-model';
export type {
  /** A validated chain model. */
  ChainModel,
  /** Level 0 of a chain. */
  ProducerLevel,
  /** A consumer level. */
  ConsumerLevel,
  /** One harvest rule. */
  HarvestRule,
  /** One stocking rule. */
  StockingRule,
} from './model/chain-model';
export {
  /** Validates an unknown value as a model; never throws. */
  validateModel,
  /** Validates a model or throws ModelValidationError. */
  parseModel,
} from './model/model-validation';
export {
  /** Reads a numeric parameter at an RFC 6901 pointer, e.g. `/levels/1/handlingTime`. */
  getParameter,
  /** Returns a copy of the model with one parameter changed (validated). */
  withParameter,
  /** Every numeric parameter of a model as a pointer. */
  parameterPointers,
  /** Thrown for a pointer that names no numeric parameter. */
  ParameterPointerError,
} from './model/parameter-pointer';
export {
  /** `{ [levelId]: number }` → Float64Array in level order (throws ModelValidationError). */
  initialVector,
  /** Pointer + message issues of an initial state against a model. */
  initialStateIssues,
  /** Float64Array in level order → `{ [levelId]: number }`. */
  stateRecord,
} from './model/initial-vector';
export {
  /** Compiles a model into its allocation-free RHS + analytic Jacobian kernel. */
  compileChain,
  /** Natural magnitude of each level: S₀ = K, Sⱼ = eⱼ·Sⱼ₋₁. */
  levelScales,
  /** Quota taper width as a fraction of the level scale. */
  QUOTA_TAPER_FRACTION,
} from './model/chain-kernel';
export type {
  /** The compiled right-hand side and Jacobian of a chain. */
  ChainKernel,
} from './model/chain-kernel';

// ── Contract: limits, requests, responses, cautions ─────────────────────────────────────────
export {
  /** Hard bounds on every engine computation. */
  ENGINE_LIMITS,
} from './contract/limits';
export {
  /** zod schema of the projection request body. */
  projectionRequestSchema,
  /** zod schema of an initial state record (checked against the model separately). */
  initialStateSchema,
  /** Validates a whole projection request; pointers relative to the body. */
  validateProjectionRequest,
} from './contract/projection-request';
export type {
  /** A validated projection request with defaults filled in. */
  ProjectionRequest,
  /** A projection request as a caller may write it. */
  ProjectionRequestInput,
} from './contract/projection-request';
