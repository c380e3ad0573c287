import { Router } from 'express';
import type { Knex } from 'knex';
import { ProblemError } from '../http/problem';
import { issueKeyBody, rotateKeyBody } from '../keys/keys-routes';
import type { KeysService } from '../keys/keys-service';
import { requireTenantAction } from './access-guard';
import { parseBody } from './parse-body';
import { accessOf, clientAddress, userOf } from './signed-in-user';

/** When each of a tenant's keys last made an admitted request, from the usage ledger. */
async function lastUses(db: Knex, tenantId: string): Promise<Map<string, string>> {
  const rows = await db('usage_ledger')
    .where({ tenant_id: tenantId })
    .groupBy('key_id')
    .select('key_id')
    .max({ last: 'at' });
  const typed = rows as unknown as { key_id: string; last: string }[];
  return new Map(typed.map((r) => [r.key_id, r.last]));
}

/**
 * `/console/keys`: key management for signed-in admins, through the keys service that also
 * serves `/keys` for server keys (same rules, same audit events, actor `user:<id>`). A separate
 * path because `/keys` authenticates by bearer key.
 */
export function consoleKeysRoutes(db: Knex, keys: KeysService): Router {
  const router = Router();
  const manage = requireTenantAction('keys:manage');

  async function ownKey(tenantId: string, id: string) {
    const key = await keys.repository.find(id);
    if (!key || key.tenantId !== tenantId) {
      throw new ProblemError(404, 'not-found', 'No such key', `No key ${id} in this tenant.`);
    }
    return key;
  }

  router.get('/console/keys', requireTenantAction('keys:read'), async (req, res) => {
    const { tenantId } = accessOf(req);
    const [list, used] = await Promise.all([keys.list(tenantId), lastUses(db, tenantId)]);
    res.json({ keys: list.map((k) => ({ ...k, lastUsedAt: used.get(k.id) ?? null })) });
  });

  router.post('/console/keys', manage, async (req, res) => {
    const body = parseBody(issueKeyBody, req.body);
    const issued = await keys.issue(
      { ...body, tenantId: accessOf(req).tenantId },
      `user:${userOf(req).id}`,
      clientAddress(req),
    );
    res.status(201).location(`/api/v1/console/keys/${issued.key.id}`);
    res.set('Cache-Control', 'no-store').json(issued);
  });

  router.post('/console/keys/:id/rotate', manage, async (req, res) => {
    const body = parseBody(rotateKeyBody, req.body);
    const key = await ownKey(accessOf(req).tenantId, String(req.params.id));
    const actor = `user:${userOf(req).id}`;
    const overlap = body.overlapSeconds ?? 86_400;
    const rotated = await keys.rotate(key, overlap, actor, clientAddress(req));
    res.status(201).location(`/api/v1/console/keys/${rotated.key.id}`);
    res.set('Cache-Control', 'no-store').json(rotated);
  });

  router.delete('/console/keys/:id', manage, async (req, res) => {
    const key = await ownKey(accessOf(req).tenantId, String(req.params.id));
    await keys.revoke(key, `user:${userOf(req).id}`, clientAddress(req));
    res.status(204).end();
  });
  return router;
}
