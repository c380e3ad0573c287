import { type RequestHandler, Router } from 'express';
import type { ScenarioGuard } from './scenario-access';
import type { ScenariosService } from './scenarios-service';
import { publishedWhatIf, whatIfChangesBody } from './published-what-if';

/** The open routes' handlers the published what-ifs are answered by. */
export interface OpenAnalysisHandlers {
  /** `POST /regimes`: validation, price, bounds, cache, admission, the analysis pool. */
  readonly regimes: RequestHandler;
  /** `POST /equilibria`: the same pipeline for every equilibrium of the chain. */
  readonly equilibria: RequestHandler;
}

/**
 * `POST /published-scenarios/{publicId}/regimes` and `/equilibria`: the long-run regime and
 * the equilibria of a published scenario with the public's changes, so a page bound to a
 * published scenario never sends a whole model to the open routes and the publisher's ranges
 * hold for every analysis it shows. The what-if is checked as for the published projections
 * (same body, same refusals); the request it amounts to — the server's copy of the published
 * model with the changes, and the published start — is then answered by the open route's own
 * handler, so price, bounds, cache and pool are the open route's.
 */
export function publishedAnalysesRoutes(
  service: ScenariosService,
  guard: ScenarioGuard,
  open: OpenAnalysisHandlers,
): Router {
  const router = Router();
  const readPublished = guard({ action: 'scenarios:read', scope: 'scenarios:read', browser: true });

  router.post('/published-scenarios/:publicId/regimes', readPublished, async (req, res, next) => {
    const whatIf = await publishedWhatIf(service, req, whatIfChangesBody);
    req.body = { model: whatIf.model, initial: whatIf.content.initial };
    await open.regimes(req, res, next);
  });

  router.post(
    '/published-scenarios/:publicId/equilibria',
    readPublished,
    async (req, res, next) => {
      const whatIf = await publishedWhatIf(service, req, whatIfChangesBody);
      req.body = { model: whatIf.model };
      await open.equilibria(req, res, next);
    },
  );
  return router;
}
