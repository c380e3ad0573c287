import { createHash } from 'node:crypto';
import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { validateCalibrationRequest, type ChainModel } from '@tropline/core';
import type { KeyPrincipal } from '../auth/key-principal';
import { ProblemError, validationProblem } from '../http/problem';
import type { JobsService } from '../jobs/jobs-service';
import { CACHE_HEADER } from '../projections/sync-compute';
import { DEFAULT_PLAN, QuotasRepository } from '../quotas/quotas-repository';
import type { DatasetsService } from '../datasets/datasets-service';
import { actorOf, type Actor, type ScenarioGuard } from '../scenarios/scenario-access';
import type { ScenariosService } from '../scenarios/scenarios-service';
import type { CalibrationJobBody, CalibrationSource } from './calibration-kind';

const FIT_FIELDS = ['parameters', 'initialStates', 'starts', 'maxIterations', 'segmentLength'];

/**
 * The principal a job is admitted under: the calling key, or for a signed-in member a
 * per-user meter (`u-` + 14 hex of the user id, the key column's width) on the tenant's plan,
 * so console calibrations draw on the same monthly units as keyed ones.
 */
async function principalFor(db: Knex, actor: Actor): Promise<KeyPrincipal> {
  if (actor.principal) return actor.principal;
  const plan = (await new QuotasRepository(db).getPlan(actor.tenantId)) ?? DEFAULT_PLAN;
  const meter = 'u-' + createHash('sha256').update(actor.userId!).digest('hex').slice(0, 14);
  return {
    keyId: meter,
    kind: 'server',
    tenantId: actor.tenantId,
    tenantSlug: '',
    scopes: [],
    publishedOnly: false,
    monthlyUnits: plan.monthlyUnits,
    perMinute: plan.perMinute,
  };
}

/**
 * `POST /scenarios/{id}/calibrations` (a job fitting a scenario version to a dataset version),
 * `GET /calibrations/{id}` (the job, for keys and sessions alike) and
 * `POST /calibrations/{id}/versions` (save the fitted model as a new scenario version).
 */
export function calibrationRoutes(
  db: Knex,
  jobs: JobsService,
  scenarios: ScenariosService,
  datasets: DatasetsService,
  guard: ScenarioGuard,
): Router {
  const router = Router();
  const run = guard({ action: 'analyses:run', scope: 'scenarios:write' });
  const read = guard({ action: 'scenarios:read', scope: 'scenarios:read' });
  const write = guard({ action: 'scenarios:write', scope: 'scenarios:write' });

  async function calibrationJob(req: Request) {
    const actor = actorOf(req);
    const job = await jobs.get(await principalFor(db, actor), String(req.params.id));
    if (job.kind !== 'calibrations') {
      throw new ProblemError(
        404,
        'not-found',
        'No such calibration',
        `Job ${job.id} is a ${job.kind}.`,
      );
    }
    return job;
  }

  router.post('/scenarios/:id/calibrations', run, async (req, res) => {
    const actor = actorOf(req);
    const body = (req.body ?? {}) as Record<string, unknown>;
    const s = await scenarios.require(actor, String(req.params.id));
    const errors = [];
    if (!Number.isSafeInteger(body.dataset)) {
      errors.push({
        pointer: '/dataset',
        message: 'dataset is required: a dataset version number',
      });
    }
    const unknown = Object.keys(body).filter(
      (k) => !['dataset', 'scenarioVersion', ...FIT_FIELDS].includes(k),
    );
    for (const k of unknown) errors.push({ pointer: `/${k}`, message: `unknown field "${k}"` });
    if (errors.length) throw validationProblem(errors);
    const version =
      body.scenarioVersion === undefined ? s.latestVersion : Number(body.scenarioVersion);
    const base = await scenarios.requireVersion(actor, s.id, version);
    const data = await datasets.get(actor, s.id, Number(body.dataset));
    const calibration = {
      model: base.content.model,
      initial: base.content.initial,
      observations: data.series,
      ...Object.fromEntries(FIT_FIELDS.filter((k) => k in body).map((k) => [k, body[k]])),
    };
    const checked = validateCalibrationRequest(calibration);
    if (!checked.ok) throw validationProblem([...checked.errors]);
    const source: CalibrationSource = {
      scenarioId: s.id,
      scenarioVersion: version,
      dataset: data.version,
    };
    const jobBody: CalibrationJobBody = { source, calibration };
    const idempotency = req.get('Idempotency-Key');
    const created = await jobs.create(
      await principalFor(db, actor),
      'calibrations',
      jobBody,
      idempotency,
      res,
    );
    const self = `/api/v1/calibrations/${created.job.id}`;
    res.set(CACHE_HEADER, created.cache);
    res
      .status(202)
      .location(self)
      .json({ ...created.job, links: { ...created.job.links, calibration: self } });
  });

  router.get('/calibrations/:id', read, async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await calibrationJob(req));
  });

  router.post('/calibrations/:id/versions', write, async (req, res) => {
    const job = await calibrationJob(req);
    if (job.status !== 'succeeded') {
      throw new ProblemError(
        409,
        'version-state',
        'The calibration has not succeeded',
        `Calibration ${job.id} is ${job.status}; save it once it has succeeded.`,
        { errors: [{ pointer: '', message: `job status is ${job.status}` }] },
      );
    }
    const result = job.result as {
      source: CalibrationSource;
      model: ChainModel;
      initial: Record<string, number>;
      estimates: { pointer: string; value: number }[];
    };
    const actor = actorOf(req);
    const base = await scenarios.requireVersion(
      actor,
      result.source.scenarioId,
      result.source.scenarioVersion,
    );
    const note =
      typeof req.body?.changeNote === 'string' && req.body.changeNote.trim()
        ? req.body.changeNote
        : `Calibrated to dataset version ${result.source.dataset} (` +
          result.estimates
            .map((e) => `${e.pointer} = ${Number(e.value.toPrecision(4))}`)
            .join(', ') +
          ')';
    const saved = await scenarios.save(
      actor,
      result.source.scenarioId,
      { changeNote: note.slice(0, 500) },
      {
        ...base.content,
        model: result.model,
        initial: result.initial,
      },
    );
    res
      .status(201)
      .location(`/api/v1/scenarios/${result.source.scenarioId}/versions/${saved.version.version}`)
      .json(saved);
  });
  return router;
}
