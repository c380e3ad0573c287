import { Router } from 'express';
import type { Knex } from 'knex';
import { CORE_VERSION } from '@tropline/core';

/** `GET /api/v1/health`: the process answers and the database responds. */
export function healthRoutes(db: Knex): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const started = process.hrtime.bigint();
    await db.raw('select 1');
    const dbMs = Number(process.hrtime.bigint() - started) / 1e6;
    res.json({ status: 'ok', version: CORE_VERSION, database: { status: 'ok', latencyMs: dbMs } });
  });
  return router;
}
