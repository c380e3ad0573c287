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

// ── Derived views and presets ───────────────────────────────────────────────────────────────
export {
  /** Nondimensional groups aⱼ, bⱼ, dⱼ, time and state scales of a 2–4 level chain. */
  nondimensionalGroups,
  /** The paper's a1, b1, a2, b2, d1, d2 of a three-level chain. */
  hastingsPowellGroups,
  /** Maps Hastings–Powell groups back onto a dimensional three-level model. */
  fromHastingsPowell,
} from './model/hastings-powell';
export type {
  /** Nondimensional groups of a chain. */
  NondimensionalGroups,
  /** The six Hastings–Powell groups. */
  HastingsPowellGroups,
  /** Free dimensional scales (r, K, efficiencies) for the mapping back. */
  DimensionalScales,
} from './model/hastings-powell';
export {
  /** Hastings & Powell (1991) benchmark at b1 = 3, start (0.8, 0.2, 9). */
  HASTINGS_POWELL_BENCHMARK,
  /** Two-level Rosenzweig–MacArthur model (cycles). */
  ROSENZWEIG_MACARTHUR,
  /** Invented lake in real units mapping exactly onto the benchmark (chaotic). */
  LAKE_DEMO,
  /** Invented upland in real units (settles). */
  UPLAND_DEMO,
  /** Every preset. */
  CHAIN_PRESETS,
} from './model/presets';
export type {
  /** A ready-made model with its start and provenance. */
  ChainPreset,
} from './model/presets';

// ── Integration and projection ──────────────────────────────────────────────────────────────
export {
  /** Bounded ODEX integration of any Float64Array kernel with dense output and callbacks. */
  integrateChain,
  /** Blow-up bound as a multiple of a component's scale. */
  BLOW_UP_FACTOR,
  /** Slack below zero (in absolute tolerances) before a level counts as negative. */
  NEGATIVE_SLACK,
} from './integrate/integrate-chain';
export type {
  /** Options of integrateChain. */
  IntegrateOptions,
  /** Result of integrateChain. */
  IntegrateResult,
  /** ODEX's dense interpolant of the last step. */
  DenseInterpolant,
} from './integrate/integrate-chain';
export {
  /** Typed integration failure with a cause code, time and level. */
  IntegrationError,
} from './integrate/integration-error';
export type {
  /** Cause codes of IntegrationError. */
  IntegrationFailure,
  /** Integrator counters. */
  IntegrationDiagnostics,
} from './integrate/integration-error';
export {
  /** Adapts a Float64Array kernel to odex's number[] callback, reusing buffers. */
  odexDerivative,
} from './integrate/odex-derivative';
export type {
  /** Any kernel with a dimension and an allocation-free RHS. */
  OdeKernel,
  /** An odex callback with its evaluation counter. */
  OdexDerivative,
} from './integrate/odex-derivative';
export {
  /** Validates and runs a projection request (the API's /projections). */
  project,
  /** Runs an already validated projection request. */
  projectValidated,
  /** Evenly spaced sample times 0..horizon. */
  sampleTimes,
  /** Per-level absolute tolerances for a relative tolerance (the engine's floor). */
  absoluteFloor,
  /** The floor as a fraction of the tolerance times min(1, level scale). */
  ABSOLUTE_FLOOR_FRACTION,
} from './integrate/project';
export type {
  /** Budgets for one projection. */
  ProjectOptions,
} from './integrate/project';

// ── Equilibria and stability ────────────────────────────────────────────────────────────────
export {
  /** Every equilibrium of a chain with eigenvalues and stability. */
  findEquilibria,
  /** Validates an equilibria request body and answers `{ equilibria }`. */
  computeEquilibria,
} from './equilibria/find-equilibria';
export type {
  /** One equilibrium with its stability. */
  Equilibrium,
} from './equilibria/find-equilibria';
export {
  /** Whether a model's equilibria have a closed form. */
  hasClosedForm,
  /** Closed-form equilibria with levels 0..top present. */
  closedFormEquilibria,
  /** Real roots of a quadratic without cancellation. */
  quadraticRoots,
} from './equilibria/closed-form';
export {
  /** Damped Newton on a kernel's f(y) = 0. */
  newtonRoot,
  /** Newton fallback from many deterministic starts. */
  newtonEquilibria,
} from './equilibria/newton-equilibria';
export type {
  /** Options of the Newton fallback. */
  NewtonOptions,
} from './equilibria/newton-equilibria';
export {
  /** Eigenvalues of a row-major matrix via ml-matrix. */
  eigenvalues,
} from './stability/eigenvalues';
export type {
  /** One eigenvalue `{ re, im }`. */
  Eigenvalue,
} from './stability/eigenvalues';
export {
  /** Stability verdict and plain-language class from eigenvalues. */
  classifyEquilibrium,
} from './stability/classify-equilibrium';
export type {
  /** Plain-language equilibrium class. */
  EquilibriumClass,
  /** Stability verdict. */
  StabilityVerdict,
} from './stability/classify-equilibrium';

// ── Analyses (appended by the analyses work; keep below this line) ──────────────────────────

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

// ── Analyses: regimes, sweeps, maps, ensembles, comparisons, pool (analyses work) ────────────
export {
  /** Dormand–Prince 8(5,3) with order-7 dense output; allocation-free, for the long runs. */
  Dop853,
} from './integrate/dop853';
export type {
  /** How an integration ended. */
  Dop853Outcome,
  /** Outcome and counters of one integration. */
  Dop853Result,
  /** Called after each accepted step. */
  Dop853StepCallback,
} from './integrate/dop853';
export {
  /** Thrown before integrating when a DOP853 option is unusable. */
  Dop853OptionError,
} from './integrate/dop853-options';
export type {
  /** DOP853 tolerances and limits. */
  Dop853Options,
  /** y' = f(t, y) written into a caller-owned buffer. */
  RhsFunction,
} from './integrate/dop853-options';
export {
  /** Benettin Lyapunov exponents with batch-means standard errors. */
  lyapunovSpectrum,
} from './lyapunov/lyapunov-spectrum';
export type {
  /** Exponents, errors, divergence and window statistics. */
  LyapunovResult,
} from './lyapunov/lyapunov-spectrum';
export {
  /** Thrown for an unusable Lyapunov option. */
  LyapunovOptionError,
} from './lyapunov/lyapunov-options';
export type {
  /** Transient, window, exponents, batches, tolerances. */
  LyapunovOptions,
} from './lyapunov/lyapunov-options';
export {
  /** The regime rules (collapse, equilibrium, chaotic, cycle) applied to a run. */
  classifyRegime,
  /** ln(Δ/δ0)/λ for λ > 0, else undefined. */
  predictabilityHorizon,
  /** "not limited by chaos". */
  NOT_LIMITED_BY_CHAOS,
} from './regime/classify-regime';
export type {
  /** 'equilibrium' | 'cycle' | 'chaotic' | 'collapse'. */
  Regime,
  /** Thresholds of the classification. */
  RegimeRules,
  /** A regime with its period or collapsed levels. */
  RegimeVerdict,
} from './regime/classify-regime';
export {
  /** The `/regimes` computation: regime, exponent, period, predictability horizon. */
  assessRegime,
  /** The same on a compiled kernel and start vector. */
  assessKernel,
  /** Quasi-extinction thresholds in level order (default 1e-6 of each level's scale). */
  extinctionThresholds,
  /** Default quasi-extinction threshold as a fraction of the level scale. */
  DEFAULT_EXTINCTION_FRACTION,
  /** Thrown when an analysis integration cannot finish. */
  AnalysisRunError,
} from './regime/assess-regime';
export type {
  /** Options of a regime assessment. */
  RegimeOptions,
  /** The regime answer with its evidence. */
  RegimeReport,
} from './regime/assess-regime';
export {
  /** Period and maxima per period from the recurrence of successive maxima. */
  periodFromMaxima,
} from './regime/period-from-maxima';
export {
  /** Local maxima of one component located from DOP853's dense output. */
  LocalMaxima,
} from './regime/local-maxima';
export {
  /** A chain kernel specialised to one model (same equations as compileChain, unrolled). */
  specialiseChain,
} from './sweep/specialise-chain';
export {
  /** Sweep points [start, end) in-process. */
  runSweepRange,
  /** The parameter values of a sweep. */
  sweepValues,
  /** Weighted work of a sweep. */
  sweepWork,
  /** Throws AnalysisBoundsError for an oversized sweep. */
  assertSweepBounds,
} from './sweep/run-sweep';
export type {
  /** One value of a bifurcation diagram. */
  SweepPoint,
} from './sweep/sweep-point';
export {
  /** Regime-map cells [start, end) in-process. */
  runRegimeMapCells,
  /** Row-major cells → the map response. */
  assembleRegimeMap,
  /** Weighted work of a regime map. */
  regimeMapWork,
  /** Throws AnalysisBoundsError for an oversized map. */
  assertRegimeMapBounds,
} from './sweep/run-regime-map';
export type {
  /** One cell of a regime map. */
  RegimeMapCell,
} from './sweep/run-regime-map';
export {
  /** Ensemble members [start, end) in-process. */
  runEnsembleMembers,
  /** Sample times of an ensemble. */
  ensembleTimes,
  /** Throws AnalysisBoundsError for an oversized ensemble. */
  assertEnsembleBounds,
} from './ensemble/run-ensemble-members';
export {
  /** Percentile bands and quasi-extinction probabilities from all members. */
  summariseEnsemble,
  /** Quantile by Hyndman & Fan definition 7. */
  quantileSorted,
} from './ensemble/summarise-ensemble';
export type {
  /** An ensemble's summary. */
  EnsembleResult,
  /** p5 … p95 per sample time. */
  PercentileBands,
} from './ensemble/summarise-ensemble';
export {
  /** One draw from a distribution. */
  sampleDistribution,
  /** Thrown when a truncation keeps too little of a distribution. */
  DistributionError,
} from './ensemble/distribution';
export type {
  /** Normal, log-normal (optionally truncated) or uniform. */
  Distribution,
} from './ensemble/distribution';
export {
  /** The seeded pure-rand stream of one ensemble member. */
  memberGenerator,
} from './ensemble/member-generator';
export {
  /** One scenario of a comparison (0 = baseline). */
  runScenario,
  /** A scenario's changes applied to the baseline (never mutating it). */
  applyChanges,
  /** Throws AnalysisBoundsError for an oversized comparison. */
  assertComparisonBounds,
  /** Each level's quasi-extinction threshold in level order (defaults filled in). */
  thresholdVector,
} from './compare/compare-scenarios';
export type {
  /** One scenario's outcome. */
  ScenarioOutcome,
} from './compare/compare-scenarios';
export type {
  /** Per-level figures of one scenario. */
  LevelSummary,
} from './compare/scenario-levels';
// createAnalysisPool is Node-only: it lives in './node' (`@tropline/core/node`) so browser
// bundles never reach piscina or Node built-ins. Its types stay here.
export type {
  /** The pool: runSweep, runRegimeMap, runEnsemble, runComparison, runRegime, close. */
  AnalysisPool,
  /** `{ size, chunksPerWorker? }`. */
  AnalysisPoolOptions,
  /** `{ onProgress?, signal? }`. */
  AnalysisRunOptions,
  /** A sweep's points and counters. */
  SweepResult,
  /** A regime map. */
  RegimeMapResult,
  /** A comparison's scenarios. */
  ComparisonResult,
} from './pool/analysis-pool';
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

// ── Analyses: work estimates for quotas (analyses work) ─────────────────────────────────────
export {
  /** Weighted time units of a regime assessment. */
  regimeWork,
} from './regime/assess-regime';
export {
  /** Weighted time units of an ensemble. */
  ensembleWork,
} from './ensemble/run-ensemble-members';
export {
  /** Weighted time units of a comparison. */
  comparisonWork,
} from './compare/compare-scenarios';

// ── Scenarios and calibration (scenarios work) ──────────────────────────────────────────────
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
export {
  /** Fits parameters and initial states to monitoring series (log-scale least squares). */
  calibrateChain,
} from './calibrate/calibrate-chain';
export type {
  /** A calibration's estimates, fit, residuals, trajectory and chaos verdict. */
  CalibrationResult,
  /** One fitted value with its standard error. */
  Estimate,
  /** Progress and cancellation of a calibration. */
  CalibrateOptions,
} from './calibrate/calibrate-chain';
export {
  /** Seeded monitoring series from a known model with log-normal error. */
  syntheticSeries,
} from './calibrate/synthetic-series';
export type {
  /** Options of syntheticSeries. */
  SyntheticOptions,
  /** Series with their truth. */
  SyntheticSeries,
} from './calibrate/synthetic-series';
