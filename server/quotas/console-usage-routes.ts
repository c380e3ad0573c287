import { Router } from 'express';
import type { Knex } from 'knex';
import { requireTenantAction } from '../accounts/access-guard';
import { accessOf } from '../accounts/signed-in-user';
import { ConsoleUsageRepository } from './console-usage-repository';
import { nextPeriodStart, periodOf } from './quotas-service';

/**
 * `GET /console/usage`: the signed-in member's tenant this month, in more detail than the keyed
 * `GET /usage` (per day, key and endpoint, both rate limits, the alerts sent). Role matrix
 * action `usage:read`, which every tenant role holds. A separate path because `/usage`
 * authenticates by bearer key.
 */
export function consoleUsageRoutes(db: Knex, now: () => number): Router {
  const router = Router();
  const usage = new ConsoleUsageRepository(db);
  router.get('/console/usage', requireTenantAction('usage:read'), async (req, res) => {
    const nowMs = now();
    const period = periodOf(nowMs);
    const month = await usage.month(accessOf(req).tenantId, period);
    res.set('Cache-Control', 'no-store').json({
      period,
      used: month.used,
      limit: month.plan.monthlyUnits,
      resetsAt: new Date(nextPeriodStart(nowMs)).toISOString(),
      perMinute: month.plan.perMinute,
      browserPerMinute: month.plan.browserPerMinute,
      byDay: month.byDay,
      byKey: month.byKey,
      byEndpoint: month.byEndpoint,
      alerts: month.alerts,
    });
  });
  return router;
}
