import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import {
  publicBoundsIssues,
  validateCalibrationRequest,
  type ChainModel,
  type ValidationIssue,
} from '@tropline/core';
import type { KeyPrincipal } from '../auth/key-principal';
import { ProblemError, validationProblem } from '../http/problem';
import { isFinished, streamJobEvents } from '../jobs/job-events';
import type { JobsService } from '../jobs/jobs-service';
import { CACHE_HEADER } from '../projections/sync-compute';
import { memberPrincipal } from '../quotas/member-principal';
import { datasetMismatch, type DatasetsService } from '../datasets/datasets-service';
import { actorOf, type Actor, type ScenarioGuard } from '../scenarios/scenario-access';
import type { ScenariosService } from '../scenarios/scenarios-service';
import type { CalibrationJobBody, CalibrationSource } from './calibration-kind';

const FIT_FIELDS = ['parameters', 'initialStates', 'starts', 'maxIterations', 'segmentLength'];

/**
 * The principal a job is admitted under: the calling key, or for a signed-in member their own
 * meter on the tenant's plan, so console calibrations draw on the same monthly units.
 */
async function principalFor(db: Knex, actor: Actor): Promise<KeyPrincipal> {
  return actor.principal ?? memberPrincipal(db, actor.tenantId, actor.userId!);
}

/**
 * The engine checks the assembled request, whose observations come from the dataset and whose
 * model and start come from the scenario version: point its complaints at the body's fields.
 */
function bodyPointer(issue: ValidationIssue): ValidationIssue {
  const [, head] = issue.pointer.split('/');
  if (head === 'observations') {
    return { pointer: '/dataset', message: `the dataset's ${issue.pointer}: ${issue.message}` };
  }
  if (head === 'model' || head === 'initial') {
    return {
      pointer: '/scenarioVersion',
      message: `the scenario version's ${issue.pointer}: ${issue.message}`,
    };
  }
  return issue;
}

/**
 * `POST /scenarios/{id}/calibrations` (a job fitting a scenario version to a dataset version),
 * `GET /calibrations/{id}` (the job, for keys and sessions alike), its progress as Server-Sent
 * Events (`…/events`, the format of `/jobs/{id}/events`), `DELETE /calibrations/{id}` (cancel)
 * and `POST /calibrations/{id}/versions` (save the fitted model as a new scenario version).
 * Another tenant's job, or a job of another kind, is a 404.
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
    const errors: ValidationIssue[] = [];
    const isVersion = (v: unknown) => Number.isSafeInteger(v) && (v as number) >= 1;
    if (!isVersion(body.dataset)) {
      errors.push({
        pointer: '/dataset',
        message: 'dataset is required: a dataset version number (1, 2, …)',
      });
    }
    if (body.scenarioVersion !== undefined && !isVersion(body.scenarioVersion)) {
      errors.push({ pointer: '/scenarioVersion', message: 'a version number (1, 2, …)' });
    }
    const unknown = Object.keys(body).filter(
      (k) => !['dataset', 'scenarioVersion', ...FIT_FIELDS].includes(k),
    );
    for (const k of unknown) errors.push({ pointer: `/${k}`, message: `unknown field "${k}"` });
    if (errors.length) throw validationProblem(errors);
    const version = (body.scenarioVersion as number | undefined) ?? s.latestVersion;
    const base = await scenarios.repository.version(s.id, version);
    if (!base) {
      throw validationProblem([
        {
          pointer: '/scenarioVersion',
          message: `no version ${version}; the latest is ${s.latestVersion}`,
        },
      ]);
    }
    const found = await datasets.repository.find(s.id, body.dataset as number);
    if (!found) {
      throw validationProblem([
        {
          pointer: '/dataset',
          message: `the scenario has no dataset version ${String(body.dataset)}`,
        },
      ]);
    }
    const data = await datasets.get(actor, s.id, found.meta.version);
    const mismatch = datasetMismatch(data, base.content.model, version);
    if (mismatch.length) throw validationProblem(mismatch);
    const calibration = {
      model: base.content.model,
      initial: base.content.initial,
      observations: data.series,
      ...Object.fromEntries(FIT_FIELDS.filter((k) => k in body).map((k) => [k, body[k]])),
    };
    const checked = validateCalibrationRequest(calibration);
    if (!checked.ok) throw validationProblem(checked.errors.map(bodyPointer));
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

  // Following and cancelling a calibration: whoever may start one (analyses:run for members).
  router.get('/calibrations/:id/events', run, async (req, res) => {
    const job = await calibrationJob(req); // 404 before the stream starts
    streamJobEvents(jobs, await principalFor(db, actorOf(req)), job, req, res);
  });

  router.delete('/calibrations/:id', run, async (req, res) => {
    const found = await calibrationJob(req);
    const job = await jobs.cancel(await principalFor(db, actorOf(req)), found.id);
    res.status(isFinished(job) ? 200 : 202).json(job);
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
    const body = (req.body ?? {}) as Record<string, unknown>;
    const extra = Object.keys(body).filter((k) => !['changeNote', 'publicParameters'].includes(k));
    if (extra.length) {
      throw validationProblem(
        extra.map((k) => ({ pointer: `/${k}`, message: `unknown field "${k}"` })),
      );
    }
    const actor = actorOf(req);
    const base = await scenarios.requireVersion(
      actor,
      result.source.scenarioId,
      result.source.scenarioVersion,
    );
    // The version's public ranges must hold the fitted values; if one does not, the caller
    // sends ranges that do (the publisher's choice is never widened behind their back).
    if (!('publicParameters' in body)) {
      const outside = publicBoundsIssues(result.model, base.content.publicParameters);
      if (outside.length) {
        throw validationProblem(
          outside.map((e) => ({
            ...e,
            message: `${e.message} (the fitted model); send publicParameters whose ranges hold it`,
          })),
        );
      }
    }
    const note =
      typeof body.changeNote === 'string' && body.changeNote.trim()
        ? body.changeNote
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
        ...('publicParameters' in body
          ? { publicParameters: body.publicParameters as typeof base.content.publicParameters }
          : {}),
      },
    );
    res
      .status(201)
      .location(`/api/v1/scenarios/${result.source.scenarioId}/versions/${saved.version.version}`)
      .json(saved);
  });
  return router;
}
