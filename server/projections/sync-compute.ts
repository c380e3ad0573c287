import type { RequestHandler, Response } from 'express';
import type { ValidationResult } from '@tropline/core';
import { principalOf } from '../auth/key-principal';
import { validationProblem } from '../http/problem';
import type { QuotasService } from '../quotas/quotas-service';
import { COSTS } from '../quotas/compute-costs';
import { unvalidatedRequestHash } from './canonical-json';
import { SerializedAnswer } from './serialized-answer';
import { TurnOutcome } from './compute-turns';
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
  /**
   * Runs the computation (in-thread when small, one per turn of the event loop through
   * `onComputeTurn`; on a worker thread when not), answering the result, its turn's outcome, or
   * its bytes when a worker thread serialised it.
   */
  compute(request: T): unknown;
}

/** Milliseconds since the request was stamped (by `stampStart`). */
function elapsed(res: Response): number {
  return performance.now() - ((res.locals.startedAt as number | undefined) ?? performance.now());
}

/**
 * Middleware that stamps when the server began on a request (for `Server-Timing`); the first
 * stamp counts, so the app can stamp at its door and routers again for their own mounts.
 */
export const stampStart: RequestHandler = (_req, res, next) => {
  res.locals.startedAt ??= performance.now();
  next();
};

/** Header that says whether an answer came from the cache. */
export const CACHE_HEADER = 'Tropline-Cache';

/** Milliseconds as Server-Timing writes them. */
const ms = (t: number) => t.toFixed(3);

/**
 * Writes a JSON answer that is already bytes (a cache entry, or one just serialised): no
 * second encoding, and no ETag (a hash of the whole body, useless on a POST answer).
 */
function sendJson(res: Response, body: Buffer, cache: 'hit' | 'miss', timing: string): void {
  res.setHeader('Server-Timing', timing);
  res.setHeader(CACHE_HEADER, cache);
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('Content-Length', body.length);
  res.status(200).end(body);
}

/**
 * The pipeline every synchronous compute route shares, in the order that keeps refusals
 * cheap: cache lookup, validate (400), price and bound (422), admission (429), compute, answer.
 * Far from the limits the computation runs while the admission commits on the ledger's thread;
 * the answer still waits for the admission to be durable, and a refused request's result is
 * thrown away. A failure after admission gives the units back.
 */
export function syncCompute<T>(
  endpoint: SyncEndpoint<T>,
  quotas: QuotasService,
  cache: ResultCache,
): RequestHandler {
  return async (req, res) => {
    const principal = principalOf(req);
    // Only bodies that passed validation and their bounds are ever cached, so a hit needs
    // neither again.
    const hash = unvalidatedRequestHash(principal.tenantId, endpoint.name, req.body);
    const hit = hash === undefined ? undefined : cache.get(hash);
    if (hit !== undefined) {
      const waited = performance.now();
      await quotas.admit(principal, endpoint.name, COSTS.cached, res, true);
      const admitMs = performance.now() - waited;
      sendJson(res, hit, 'hit', `admit;dur=${ms(admitMs)}, total;dur=${ms(elapsed(res))}`);
      return;
    }
    const checked = endpoint.validate(req.body);
    if (!checked.ok) throw validationProblem([...checked.errors]);
    let cost: number;
    try {
      cost = endpoint.cost(checked.value);
    } catch (err) {
      throw engineProblem(err);
    }
    const pending = quotas.begin(principal, endpoint.name, cost, res);
    let waited = performance.now();
    if (!pending.overlap) await pending.decided(res);
    let admitMs = performance.now() - waited;
    const started = performance.now();
    let computeMs = 0;
    let queueMs = 0;
    let jsonMs = 0;
    let body: Buffer | undefined;
    let failure: unknown;
    try {
      let result = await endpoint.compute(checked.value);
      computeMs = performance.now() - started;
      if (result instanceof TurnOutcome) {
        ({ waitedMs: queueMs, computeMs } = result);
        result = result.value;
      }
      const serialising = performance.now();
      body =
        result instanceof SerializedAnswer ? result.bytes : Buffer.from(JSON.stringify(result));
      jsonMs = performance.now() - serialising;
    } catch (err) {
      failure = err;
    }
    waited = performance.now();
    const ticket = await pending.decided(res); // a refusal throws here; the result is dropped
    admitMs += performance.now() - waited;
    if (body === undefined) {
      await quotas.refund(ticket);
      throw engineProblem(failure); // rethrows what is not the engine's typed error (a 500)
    }
    if (hash !== undefined) cache.set(hash, body);
    // Server-side time (auth, admission, validation, compute, serialisation) for integrators
    // and the benchmark; the network and the client are not in it. An answer serialised on a
    // worker thread counts its JSON in compute.
    sendJson(
      res,
      body,
      'miss',
      `queue;dur=${ms(queueMs)}, compute;dur=${ms(computeMs)}, json;dur=${ms(jsonMs)}, ` +
        `admit;dur=${ms(admitMs)}, ` +
        `total;dur=${ms(elapsed(res))}`,
    );
  };
}
