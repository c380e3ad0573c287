import { Router } from 'express';
import type { Knex } from 'knex';
import type { SessionStack } from '../accounts/session-stack';
import { workerThreads } from '../auth/keyed-api';
import { CalibrationPool } from '../calibration/calibration-pool';
import { calibrationKind } from '../calibration/calibration-kind';
import { calibrationRoutes } from '../calibration/calibration-routes';
import { datasetsRoutes } from '../datasets/datasets-routes';
import { DatasetsService } from '../datasets/datasets-service';
import type { JobsService } from '../jobs/jobs-service';
import type { KeysService } from '../keys/keys-service';
import type { QuotasService } from '../quotas/quotas-service';
import { publishedAnalysesRoutes, type OpenAnalysisHandlers } from './published-analyses-routes';
import { scenarioGuard } from './scenario-access';
import { scenariosRoutes } from './scenarios-routes';
import { ScenariosService } from './scenarios-service';

/** The scenarios part of `/api/v1` and what it holds on to. */
export interface ScenariosApi {
  readonly router: Router;
  readonly scenarios: ScenariosService;
  readonly datasets: DatasetsService;
  /** Stops the calibration threads. */
  close(): Promise<void>;
}

/**
 * Scenarios, their monitoring datasets and calibrations, for keys and console sessions alike.
 * Calibrations run as jobs of the keyed API's job service on their own worker pool.
 */
export function scenariosApi(
  db: Knex,
  sessions: SessionStack,
  now: () => number,
  keyed: {
    readonly keys: KeysService;
    readonly quotas: QuotasService;
    readonly jobs: JobsService;
    readonly analysisHandlers: OpenAnalysisHandlers;
  },
): ScenariosApi {
  const guard = scenarioGuard(sessions, now, keyed);
  const scenarios = new ScenariosService(db, now);
  const datasets = new DatasetsService(db, scenarios, now);
  const pool = new CalibrationPool(workerThreads());
  keyed.jobs.register(calibrationKind(pool));
  const router = Router();
  router.use(scenariosRoutes(scenarios, guard, keyed.quotas));
  router.use(publishedAnalysesRoutes(scenarios, guard, keyed.analysisHandlers));
  router.use(datasetsRoutes(datasets, guard));
  router.use(calibrationRoutes(db, keyed.jobs, scenarios, datasets, guard));
  return { router, scenarios, datasets, close: () => pool.close() };
}
