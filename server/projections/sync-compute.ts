import type { RequestHandler, Response } from 'express';
import type { ValidationResult } from '@tropline/core';
import { principalOf } from '../auth/key-principal';
import { validationProblem } from '../http/problem';
import type { QuotasService } from '../quotas/quotas-service';
import { COSTS } from '../quotas/compute-costs';
import { requestHash } from './canonical-json';
import { engineProblem } from './engine-problem';
import type { ResultCache } from './result-cache';

/** One synchronous compute endpoint: how to check, price and run its requests. */
export interface SyncEndpoint<T> {
  /** Endpoint name in the ledger and the cache key (`projections`). */
  readonly name: string;
  /** The engine's validator: pointers relative to the body. */
  validate(body: unknown): ValidationResult<T>;
  /** Compute units of a valid request (before any work; throws a problem past a bound). */
  cost(request: T): number;
  /** Runs the computation (in-thread when small, on the worker pool when not). */
  compute(request: T): unknown;
}

/** Milliseconds since the keyed router saw the request (stamped by `stampStart`). */
function elapsed(res: Response): number {
  return performance.now() - ((res.locals.startedAt as number | undefined) ?? performance.now());
}

/** Middleware that stamps when the request reached the keyed API (for `Server-Timing`). */
export const stampStart: RequestHandler = (_req, res, next) => {
  res.locals.startedAt = performance.now();
  next();
};

/** Header that says whether an answer came from the cache. */
export const CACHE_HEADER = 'Tropline-Cache';

/**
 * The pipeline every synchronous compute route shares, in the order that keeps refusals
 * cheap: validate (400), price and bound (422), cache lookup, admission (429), compute, answer.
 * A failure after admission gives the units back.
 */
export function syncCompute<T>(
  endpoint: SyncEndpoint<T>,
  quotas: QuotasService,
  cache: ResultCache,
): RequestHandler {
  return async (req, res) => {
    const principal = principalOf(req);
    const checked = endpoint.validate(req.body);
    if (!checked.ok) throw validationProblem([...checked.errors]);
    let cost: number;
    try {
      cost = endpoint.cost(checked.value);
    } catch (err) {
      throw engineProblem(err);
    }
    const hash = requestHash(principal.tenantId, endpoint.name, req.body);
    const hit = cache.get(hash);
    if (hit !== undefined) {
      await quotas.admit(principal, endpoint.name, COSTS.cached, res, true);
      res.set('Server-Timing', `compute;dur=0, total;dur=${elapsed(res).toFixed(3)}`);
      res.set(CACHE_HEADER, 'hit').type('application/json').send(hit);
      return;
    }
    const ticket = await quotas.admit(principal, endpoint.name, cost, res);
    let body: string;
    const started = performance.now();
    let computeMs: number;
    try {
      const result = await endpoint.compute(checked.value);
      computeMs = performance.now() - started;
      body = JSON.stringify(result);
    } catch (err) {
      await quotas.refund(ticket);
      throw engineProblem(err); // rethrows what is not the engine's typed error (a 500)
    }
    cache.set(hash, body);
    // Server-side time (auth, admission, validation, compute, serialisation) for integrators
    // and the benchmark; the network and the client are not in it.
    res.set(
      'Server-Timing',
      `compute;dur=${computeMs.toFixed(3)}, total;dur=${elapsed(res).toFixed(3)}`,
    );
    res.set(CACHE_HEADER, 'miss').type('application/json').send(body);
  };
}
