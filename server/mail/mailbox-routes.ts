import { Router } from 'express';
import { ProblemError, validationProblem } from '../http/problem';
import type { MailCatcher } from './mail-catcher';

/**
 * The development mailbox: what the local catcher received, for the console's mailbox page.
 * Mounted only when the catcher runs (never in production). It needs no sign-in because the
 * people who read it are often not signed in yet: they are following an invitation or reset.
 */
export function mailboxRoutes(catcher: MailCatcher): Router {
  const router = Router();

  router.get('/dev/mailbox', (req, res) => {
    const to = typeof req.query.to === 'string' ? req.query.to.toLowerCase() : undefined;
    const messages = catcher
      .list()
      .filter((m) => !to || m.to.some((address) => address.toLowerCase() === to));
    res.set('Cache-Control', 'no-store').json({ smtpPort: catcher.port, messages });
  });

  router.get('/dev/mailbox/:id', (req, res) => {
    const raw = String(req.params.id);
    if (!/^\d+$/.test(raw)) {
      throw validationProblem([{ pointer: '/id', message: 'a message id is a whole number' }]);
    }
    const mail = catcher.find(Number(raw));
    if (!mail) {
      throw new ProblemError(404, 'not-found', 'No such message', `No message ${raw} was caught.`);
    }
    res.set('Cache-Control', 'no-store').json(mail);
  });

  router.delete('/dev/mailbox', (_req, res) => {
    catcher.clear();
    res.status(204).end();
  });
  return router;
}
