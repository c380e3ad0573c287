/**
 * @tropline/core/contract: the contract without the engine — zod schemas and validators of
 * every request and response, JSON Pointers, limits, cautions and the role matrix. This is
 * what browser code imports: nothing here reaches the integrators (odex, DOP853), ml-matrix,
 * the analyses or Node built-ins. '@tropline/core' re-exports all of it next to the engine.
 * Every public name is listed here one by one.
 */

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

// ── The model: schema, validation, parameters by pointer ────────────────────────────────────
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

// ── Limits, requests, responses, cautions ───────────────────────────────────────────────────
export {
  /** Hard bounds on every engine computation. */
  ENGINE_LIMITS,
} from './contract/limits';
export {
  /** zod schema of the projection request body (model left loose; see the next). */
  projectionRequestSchema,
  /** The projection request body with the model schema spelled out (for OpenAPI). */
  projectionRequestBodySchema,
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
export {
  /** zod schema of the projection response. */
  projectionResponseSchema,
} from './contract/projection-response';
export type {
  /** The projection response `{ times, series, diagnostics, cautions }`. */
  ProjectionResponse,
} from './contract/projection-response';
export {
  /** zod schema of the equilibria request body `{ model }`. */
  equilibriaRequestSchema,
  /** Validates an equilibria request; pointers relative to the body. */
  validateEquilibriaRequest,
  /** zod schema of one eigenvalue `{ re, im }`. */
  eigenvalueSchema,
  /** zod schema of one equilibrium in the response. */
  equilibriumSchema,
  /** zod schema of the equilibria response. */
  equilibriaResponseSchema,
} from './contract/equilibria-contract';
export type {
  /** A validated equilibria request. */
  EquilibriaRequest,
  /** The equilibria response `{ equilibria: [...] }`. */
  EquilibriaResponse,
} from './contract/equilibria-contract';
export {
  /** Caution: projections are scenario tools, not forecasts. */
  CAUTION_SCENARIO_NOT_FORECAST,
  /** Caution: chaos caps the predictability horizon. */
  CAUTION_PREDICTABILITY_HORIZON,
  /** Caution: management decisions rest with qualified biologists under local law. */
  CAUTION_MANAGEMENT_DECISIONS,
  /** All projection cautions in display order. */
  PROJECTION_CAUTIONS,
} from './contract/cautions';

// ── Answer shapes of the engine (types only: erased, nothing of the engine is loaded) ───────
export type {
  /** One equilibrium with its stability. */
  Equilibrium,
} from './equilibria/find-equilibria';
export type {
  /** One eigenvalue `{ re, im }`. */
  Eigenvalue,
} from './stability/eigenvalues';
export type {
  /** Plain-language equilibrium class. */
  EquilibriumClass,
  /** Stability verdict. */
  StabilityVerdict,
} from './stability/classify-equilibrium';

// ── Access: the role matrix (accounts work) ─────────────────────────────────────────────────
export {
  /** Roles a member holds in one tenant. */
  TENANT_ROLES,
  /** Every action the matrix governs. */
  ACTIONS,
  /** Which role may do what; the server enforces it, the console reads it. */
  ROLE_MATRIX,
  /** Whether a role may perform an action. */
  can,
  /** Whether a member with one role may grant or remove another. */
  canAssignRole,
  /** Whether a string names a tenant role. */
  isTenantRole,
} from './access/role-matrix';
export type {
  /** A role in a tenant. */
  TenantRole,
  /** A tenant role or the platform operator. */
  Role,
  /** One action of the matrix. */
  Action,
} from './access/role-matrix';

// ── Analyses: limits and request/response schemas (analyses work) ───────────────────────────
export {
  /** Bounds on every analysis request. */
  ANALYSIS_LIMITS,
  /** A request too large to run, with the pointer of the field to shrink. */
  AnalysisBoundsError,
} from './analyses-contract/analysis-limits';
export type {
  /** Which bound a request broke. */
  AnalysisBound,
} from './analyses-contract/analysis-limits';
export {
  /** zod schema of the regime request body. */
  regimeRequestSchema,
  /** zod schema of the regime response. */
  regimeResponseSchema,
  /** Validates a regime request; pointers relative to the body. */
  validateRegimeRequest,
} from './analyses-contract/regime-contract';
export type {
  /** A validated regime request. */
  RegimeRequest,
} from './analyses-contract/regime-contract';
export {
  /** zod schema of the sweep request body. */
  sweepRequestSchema,
  /** zod schema of a sweep's result. */
  sweepResultSchema,
  /** Validates a sweep request. */
  validateSweepRequest,
  /** zod schema of the regime-map request body. */
  regimeMapRequestSchema,
  /** zod schema of a regime map. */
  regimeMapResultSchema,
  /** Validates a regime-map request. */
  validateRegimeMapRequest,
} from './analyses-contract/sweep-contract';
export type {
  /** A validated sweep request. */
  SweepRequest,
  /** A validated regime-map request. */
  RegimeMapRequest,
} from './analyses-contract/sweep-contract';
export {
  /** zod schema of the ensemble request body. */
  ensembleRequestSchema,
  /** zod schema of an ensemble's result. */
  ensembleResultSchema,
  /** zod schema of an uncertainty distribution. */
  distributionSchema,
  /** Validates an ensemble request. */
  validateEnsembleRequest,
} from './analyses-contract/ensemble-contract';
export type {
  /** A validated ensemble request. */
  EnsembleRequest,
} from './analyses-contract/ensemble-contract';
export {
  /** zod schema of the comparison request body. */
  comparisonRequestSchema,
  /** zod schema of a comparison's result. */
  comparisonResultSchema,
  /** Validates a comparison request. */
  validateComparisonRequest,
} from './analyses-contract/comparison-contract';
export type {
  /** A validated comparison request. */
  ComparisonRequest,
} from './analyses-contract/comparison-contract';

// ── Scenarios and calibration requests (scenarios work) ─────────────────────────────────────
export {
  /** zod schema of one scenario version's content. */
  scenarioContentSchema,
  /** Validates scenario content; pointers under an optional prefix. */
  validateScenarioContent,
  /** zod schema of the Tropline scenario file (export/import). */
  scenarioExportSchema,
  /** Validates a scenario file for import; pointers into the file. */
  validateScenarioExport,
  /** Builds the scenario file of one version. */
  scenarioExport,
  /** `"tropline.scenario"`: the file's format tag. */
  SCENARIO_FORMAT,
  /** The file format's version. */
  SCENARIO_FORMAT_VERSION,
  /** Longest scenario horizon. */
  MAX_SCENARIO_HORIZON,
} from './scenario-contract/scenario-document';
export type {
  /** A validated scenario version's content. */
  ScenarioContent,
  /** A parsed scenario file. */
  ScenarioExport,
} from './scenario-contract/scenario-document';
export {
  /** zod schema of one public parameter and its range. */
  publicParameterSchema,
  /** Issues of public ranges against the model's own bounds. */
  publicBoundsIssues,
  /** zod schema of one public what-if change. */
  whatIfChangeSchema,
  /** Issues of what-if changes against the published ranges. */
  whatIfIssues,
  /** Most public parameters per scenario. */
  MAX_PUBLIC_PARAMETERS,
} from './scenario-contract/public-bounds';
export type {
  /** One public parameter and its range. */
  PublicParameter,
} from './scenario-contract/public-bounds';
export {
  /** Field-by-field differences of two JSON documents as JSON Pointers. */
  diffDocuments,
} from './scenario-contract/scenario-diff';
export type {
  /** One difference: pointer, before, after. */
  FieldChange,
} from './scenario-contract/scenario-diff';
export {
  /** zod schema of a calibration request. */
  calibrationRequestSchema,
  /** Validates a calibration request; pointers relative to the body. */
  validateCalibrationRequest,
  /** Weighted model time a calibration integrates at most (for pricing). */
  calibrationWork,
  /** Bounds on one calibration. */
  CALIBRATION_LIMITS,
} from './calibrate/calibration-request';
export type {
  /** A validated calibration request. */
  CalibrationRequest,
} from './calibrate/calibration-request';
