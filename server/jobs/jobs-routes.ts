import { Router, type Request, type RequestHandler } from 'express';
import { principalOf } from '../auth/key-principal';
import type { KeyGuard } from '../auth/require-key';
import { ProblemError } from '../http/problem';
import type { QuotasService } from '../quotas/quotas-service';
import { CACHE_HEADER } from '../projections/sync-compute';
import { isFinished, streamJobEvents } from './job-events';
import type { JobsService } from './jobs-service';

const IDEMPOTENCY_KEY = /^[\x21-\x7e]{1,200}$/;

function idempotencyKey(req: Request): string | undefined {
  const value = req.get('Idempotency-Key');
  if (value === undefined) return undefined;
  if (!IDEMPOTENCY_KEY.test(value)) {
    throw new ProblemError(
      400,
      'validation',
      'The request is not valid',
      'Idempotency-Key must be 1 to 200 visible ASCII characters.',
      {
        errors: [{ pointer: '', message: 'Idempotency-Key header: 1 to 200 visible ASCII chars' }],
        header: 'Idempotency-Key',
      },
    );
  }
  return value;
}

/** `POST /<kind>`: creates a job; 202 with `Location` of `GET /jobs/{id}`. */
export function createJobHandler(jobs: JobsService, kind: string): RequestHandler {
  return async (req, res) => {
    const created = await jobs.create(principalOf(req), kind, req.body, idempotencyKey(req), res);
    res.set(CACHE_HEADER, created.cache);
    if (created.replayed) res.set('Idempotent-Replayed', 'true');
    res.status(202).location(created.job.links.self).json(created.job);
  };
}

/**
 * `GET /jobs/{id}`, `DELETE /jobs/{id}` and `GET /jobs/{id}/events` (Server-Sent Events: one
 * `job` event per change, the last when it finishes). Another tenant's job is a 404.
 */
export function jobsRoutes(jobs: JobsService, quotas: QuotasService, requireKey: KeyGuard) {
  const router = Router();
  const guard = [requireKey('compute'), quotas.free('jobs')];

  router.get('/jobs/:id', ...guard, async (req, res) => {
    res
      .set('Cache-Control', 'no-store')
      .json(await jobs.get(principalOf(req), String(req.params.id)));
  });

  router.delete('/jobs/:id', ...guard, async (req, res) => {
    const job = await jobs.cancel(principalOf(req), String(req.params.id));
    res.status(isFinished(job) ? 200 : 202).json(job);
  });

  router.get('/jobs/:id/events', ...guard, async (req, res) => {
    const principal = principalOf(req);
    // 404 before the stream starts.
    streamJobEvents(jobs, principal, await jobs.get(principal, String(req.params.id)), req, res);
  });
  return router;
}
