/**
 * @tropline/core/node: the Node-only part of the engine — the worker pool (piscina,
 * worker_threads) the server runs heavy analyses on. Browser bundles import '@tropline/core',
 * which must never reach Node built-ins; server code imports the pool from here.
 */
export {
  /** The piscina worker pool the server runs analyses on. */
  createAnalysisPool,
} from './pool/analysis-pool';
export {
  /** Lowers a worker thread's own scheduling priority (Linux), for the server's pools. */
  lowerThreadPriority,
} from './pool/thread-priority';
