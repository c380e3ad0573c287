/**
 * @tropline/core: the engine and the contract. No Angular, no Express, no Knex.
 * The contract (schemas, validation, pointers, limits, cautions, the role matrix) is listed
 * name by name in './contract' (`@tropline/core/contract`, what browser code imports) and
 * re-exported whole; every engine name is listed here one by one.
 */

/** Version of the engine package. */
export const CORE_VERSION = '0.1.0';

// ── The contract: everything browser code may import ────────────────────────────────────────
export * from './contract';

// ── The model's compiled kernel ─────────────────────────────────────────────────────────────
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
export {
  /** Stability verdict and plain-language class from eigenvalues. */
  classifyEquilibrium,
} from './stability/classify-equilibrium';

// ── Analyses (appended by the analyses work; keep below this line) ──────────────────────────

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
  /** The same over the window, else its later half (a cycle reached inside the window). */
  periodFromLateMaxima,
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
// The worker pool and its types are Node-only: './node' (`@tropline/core/node`). Not even its
// types are re-exported here, so browser programs that import this barrel never type-check it.

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

// ── Calibration: fitting and synthetic series (scenarios work) ──────────────────────────────
export {
  /** Fits parameters and initial states to monitoring series (log-scale least squares). */
  calibrateChain,
} from './calibrate/calibrate-chain';
export type {
  /** A calibration's estimates, fit, residuals, trajectory and chaos verdict. */
  CalibrationResult,
  /** One fitted value with its standard error. */
  Estimate,
  /** A segment's fitted start state (segmented fits). */
  SegmentStart,
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
