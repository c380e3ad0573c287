import { Router } from 'express';
import { z } from 'zod';
import { issuesFromZod } from '@tropline/core';
import { principalOf } from '../auth/key-principal';
import type { KeyGuard } from '../auth/require-key';
import { ProblemError, validationProblem } from '../http/problem';
import type { QuotasService } from '../quotas/quotas-service';
import { MAX_OVERLAP_SECONDS, type KeysService } from './keys-service';

/** Body of `POST /keys`. */
export const issueKeyBody = z.strictObject({
  kind: z.enum(['server', 'browser'], { error: 'kind must be "server" or "browser"' }),
  name: z
    .string({ error: 'name must be a string' })
    .max(120, { error: 'name: at most 120 characters' })
    .optional(),
  scopes: z
    .array(z.string({ error: 'a scope is a string' }), { error: 'scopes must be an array' })
    .max(10)
    .optional(),
  origins: z
    .array(z.string({ error: 'an origin is a string' }), { error: 'origins must be an array' })
    .max(20, { error: 'at most 20 origins' })
    .optional(),
  expiresAt: z.string({ error: 'expiresAt must be an ISO instant' }).max(40).optional(),
});

/** Body of `POST /keys/{id}/rotate`. */
export const rotateKeyBody = z.strictObject({
  overlapSeconds: z
    .number({ error: 'overlapSeconds must be a whole number of seconds' })
    .int({ error: 'overlapSeconds must be a whole number of seconds' })
    .min(0, { error: 'overlapSeconds must not be negative' })
    .max(MAX_OVERLAP_SECONDS, { error: `overlapSeconds must be at most ${MAX_OVERLAP_SECONDS}` })
    .optional(),
});

function parse<T>(schema: z.ZodType<T>, body: unknown): T {
  const result = schema.safeParse(body ?? {});
  if (!result.success) throw validationProblem(issuesFromZod(result.error));
  return result.data;
}

/**
 * `/keys`: a tenant's admins (a server key with `keys:manage`) list, issue, rotate and revoke
 * the tenant's keys. Another tenant's key id answers 404, exactly like an unknown one.
 */
export function keysRoutes(keys: KeysService, quotas: QuotasService, requireKey: KeyGuard): Router {
  const router = Router();
  const guard = [requireKey('keys:manage'), quotas.free('keys')];

  async function ownKey(tenantId: string, id: string) {
    const key = await keys.repository.find(id);
    if (!key || key.tenantId !== tenantId) {
      throw new ProblemError(404, 'not-found', 'No such key', `No key ${id} in this tenant.`);
    }
    return key;
  }

  router.get('/keys', ...guard, async (req, res) => {
    res.json({ keys: await keys.list(principalOf(req).tenantId) });
  });

  router.post('/keys', ...guard, async (req, res) => {
    const p = principalOf(req);
    const body = parse(issueKeyBody, req.body);
    const issued = await keys.issue({ ...body, tenantId: p.tenantId }, `key:${p.keyId}`, req.ip);
    res.status(201).location(`/api/v1/keys/${issued.key.id}`).set('Cache-Control', 'no-store');
    res.json(issued);
  });

  router.post('/keys/:id/rotate', ...guard, async (req, res) => {
    const p = principalOf(req);
    const body = parse(rotateKeyBody, req.body);
    const key = await ownKey(p.tenantId, String(req.params.id));
    const rotated = await keys.rotate(key, body.overlapSeconds ?? 86_400, `key:${p.keyId}`, req.ip);
    res.status(201).location(`/api/v1/keys/${rotated.key.id}`).set('Cache-Control', 'no-store');
    res.json(rotated);
  });

  router.delete('/keys/:id', ...guard, async (req, res) => {
    const p = principalOf(req);
    const key = await ownKey(p.tenantId, String(req.params.id));
    await keys.revoke(key, `key:${p.keyId}`, req.ip);
    res.status(204).end();
  });
  return router;
}
