import type { ValidationResult } from '@tropline/core';

/**
 * What a running job may use: whose it is (the tenant; the worker pool gives tenants turns), a
 * cancellation signal and a progress callback (0..1).
 */
export interface JobContext {
  readonly owner: string;
  readonly signal: AbortSignal;
  onProgress(fraction: number): void;
}

/**
 * One kind of job (`sweeps`, `ensembles` …): how to check and price a request before anything
 * runs, and how to run it off the request thread.
 */
export interface JobKind<T = unknown> {
  /** The route and ledger name. */
  readonly kind: string;
  /** The engine's validator; pointers relative to the body. */
  validate(body: unknown): ValidationResult<T>;
  /** Compute units; throws the engine's bounds error when the request is too large. */
  cost(request: T): number;
  /** Runs on the worker pool; rejects with an AbortError when `signal` fires. */
  run(request: T, ctx: JobContext): Promise<unknown>;
}

/** How long a finished job's result is kept (documented in openapi.yaml): 24 hours. */
export const JOB_RETENTION_MS = 24 * 3600_000;

/** A job older than this without a heartbeat was left by a stopped process. */
export const JOB_STALE_MS = 2 * 60_000;
