import { Router, type Request } from 'express';
import { projectValidated } from '@tropline/core';
import { onComputeTurn } from '../projections/compute-turns';
import { validationProblem } from '../http/problem';
import { engineProblem } from '../projections/engine-problem';
import { projectionCost } from '../quotas/compute-costs';
import type { QuotasService } from '../quotas/quotas-service';
import { publishedWhatIf, whatIfProjectionBody } from './published-what-if';
import { actorOf, type ScenarioGuard } from './scenario-access';
import { versionView, type ScenariosService } from './scenarios-service';

/** Reads a positive integer path or query parameter, or answers 400 naming it. */
export function intParam(req: Request, name: string, where: 'params' | 'query' = 'params') {
  const raw = (req[where] as Record<string, unknown>)[name];
  const n = Number(raw);
  if (typeof raw !== 'string' || !/^[1-9][0-9]{0,8}$/.test(raw) || !Number.isSafeInteger(n)) {
    throw validationProblem([
      { pointer: '', message: `${name} must be a version number (1, 2, …), not "${String(raw)}"` },
    ]);
  }
  return n;
}

/**
 * Scenario routes: list, create, versions (save, read, publish, retire), compare, export and
 * import, and the published view with its bounded public what-ifs. Handlers only translate
 * HTTP; the service holds the rules.
 */
export function scenariosRoutes(
  service: ScenariosService,
  guard: ScenarioGuard,
  quotas: QuotasService,
): Router {
  const router = Router();
  const read = guard({ action: 'scenarios:read', scope: 'scenarios:read' });
  const write = guard({ action: 'scenarios:write', scope: 'scenarios:write' });
  const publish = guard({ action: 'scenarios:publish', scope: 'scenarios:write' });
  const readPublished = guard({ action: 'scenarios:read', scope: 'scenarios:read', browser: true });
  const id = (req: Request) => String(req.params.id);

  router.get('/scenarios', read, async (req, res) => {
    res.json({ scenarios: await service.list(actorOf(req)) });
  });

  router.post('/scenarios', write, async (req, res) => {
    const created = await service.create(actorOf(req), req.body);
    res.status(201).location(`/api/v1/scenarios/${created.scenario.id}`).json(created);
  });

  router.post('/scenario-imports', write, async (req, res) => {
    const created = await service.import(actorOf(req), req.body);
    res.status(201).location(`/api/v1/scenarios/${created.scenario.id}`).json(created);
  });

  router.get('/scenarios/:id', read, async (req, res) => {
    res.json(await service.get(actorOf(req), id(req)));
  });

  router.post('/scenarios/:id/versions', write, async (req, res) => {
    const saved = await service.save(actorOf(req), id(req), req.body);
    res
      .status(201)
      .location(`/api/v1/scenarios/${id(req)}/versions/${saved.version.version}`)
      .json(saved);
  });

  router.get('/scenarios/:id/versions/:version', read, async (req, res) => {
    const v = await service.requireVersion(actorOf(req), id(req), intParam(req, 'version'));
    res.json(versionView(v));
  });

  router.post('/scenarios/:id/versions/:version/publish', publish, async (req, res) => {
    res.json(await service.publish(actorOf(req), id(req), intParam(req, 'version')));
  });

  router.post('/scenarios/:id/versions/:version/retire', publish, async (req, res) => {
    res.json(await service.retire(actorOf(req), id(req), intParam(req, 'version')));
  });

  router.get('/scenarios/:id/versions/:version/export', read, async (req, res) => {
    const n = intParam(req, 'version');
    const file = await service.export(actorOf(req), id(req), n);
    res
      .set('Content-Disposition', `attachment; filename="scenario-${id(req)}-v${n}.tropline.json"`)
      .json(file);
  });

  router.get('/scenarios/:id/comparison', read, async (req, res) => {
    const from = intParam(req, 'from', 'query');
    const to = intParam(req, 'to', 'query');
    res.json(await service.compare(actorOf(req), id(req), from, to));
  });

  router.get('/published-scenarios/:publicId', readPublished, async (req, res) => {
    const { scenario, version } = await service.published(
      actorOf(req).tenantId,
      String(req.params.publicId),
    );
    res.json({
      publicId: scenario.publicId,
      version: version.version,
      publishedAt: version.publishedAt,
      ...version.content,
    });
  });

  router.post('/published-scenarios/:publicId/projections', readPublished, async (req, res) => {
    const { principal, content, body, changes, model } = await publishedWhatIf(
      service,
      req,
      whatIfProjectionBody,
      (b, c) =>
        (b.horizon ?? c.horizon) > c.horizon
          ? [{ pointer: '/horizon', message: `at most the scenario's horizon ${c.horizon}` }]
          : [],
    );
    const request = {
      model,
      initial: content.initial,
      horizon: body.horizon ?? content.horizon,
      samples: body.samples ?? 201,
      tolerance: 1e-8,
    };
    const ticket = await quotas.admit(principal, 'projections', projectionCost(request), res);
    try {
      const { value } = await onComputeTurn(() => projectValidated(request, { wallTimeMs: 2000 }));
      res.json({ changes, ...value });
    } catch (err) {
      await quotas.refund(ticket);
      throw engineProblem(err);
    }
  });
  return router;
}
