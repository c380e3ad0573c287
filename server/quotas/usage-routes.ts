import { Router } from 'express';
import { principalOf } from '../auth/key-principal';
import type { KeyGuard } from '../auth/require-key';
import type { QuotasService } from './quotas-service';

/** `GET /usage`: the key's tenant's compute units this month. Reading usage costs no units. */
export function usageRoutes(quotas: QuotasService, requireKey: KeyGuard): Router {
  const router = Router();
  router.get('/usage', requireKey('usage:read'), quotas.free('usage'), async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await quotas.usage(principalOf(req)));
  });
  return router;
}
