import { Router } from 'express';
import { resetCompleteBody, resetRequestBody } from './account-schemas';
import { parseBody } from './parse-body';
import type { PasswordResetsService } from './password-resets-service';
import { clientAddress } from './signed-in-user';

/** `/password-resets`: ask for a link by e-mail; complete it with a new password. */
export function passwordResetsRoutes(resets: PasswordResetsService): Router {
  const router = Router();

  router.post('/password-resets', async (req, res) => {
    const body = parseBody(resetRequestBody, req.body);
    await resets.request(body.email, clientAddress(req));
    // The same answer whether or not the address has an account.
    res.status(202).json({
      detail:
        'If an account uses this address, a link to choose a new password is on its way. ' +
        'It works once, for 30 minutes.',
    });
  });

  router.post('/password-resets/complete', async (req, res) => {
    const body = parseBody(resetCompleteBody, req.body);
    await resets.complete(body.token, body.password, clientAddress(req));
    res.status(204).end();
  });
  return router;
}
