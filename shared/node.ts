/**
 * @tropline/core/node: the Node-only part of the engine — the worker pool (piscina,
 * worker_threads, thread priorities) the server runs heavy analyses on, and its types. Browser
 * code imports '@tropline/core/contract' (Angular hosts' specs may import '@tropline/core'),
 * neither of which may reach Node built-ins, not even for types: a browser program that only
 * type-checks the pool's file fails without Node's types. Server code imports the pool from here.
 */
export {
  /** The piscina worker pool the server runs analyses on. */
  createAnalysisPool,
} from './pool/analysis-pool';
export type {
  /** The pool: runSweep, runRegimeMap, runEnsemble, runComparison, runRegime, close. */
  AnalysisPool,
  /** `{ size, chunksPerWorker?, niceness? }`. */
  AnalysisPoolOptions,
  /** `{ onProgress?, signal?, owner?, priority? }`. */
  AnalysisRunOptions,
  /** A sweep's points and counters. */
  SweepResult,
  /** A regime map. */
  RegimeMapResult,
  /** A comparison's scenarios. */
  ComparisonResult,
} from './pool/analysis-pool';
