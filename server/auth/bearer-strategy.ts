import type { Request, RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as BearerStrategy } from 'passport-http-bearer';
import { ProblemError } from '../http/problem';
import type { KeysService } from '../keys/keys-service';
import type { KeyPrincipal } from './key-principal';
import { requestOrigin } from './request-origin';

/** Name the strategy is registered under. */
export const KEY_STRATEGY = 'tropline-key';

/**
 * A Passport authenticator of its own (not the global one, which the console's session login
 * will configure), holding the bearer strategy for API keys. The verify step asks the keys
 * service, which reads the key afresh on every request.
 */
export function keyAuthenticator(keys: KeysService): passport.Authenticator {
  const authenticator = new passport.Authenticator();
  authenticator.use(
    KEY_STRATEGY,
    new BearerStrategy(
      { passReqToCallback: true },
      (req: Request, token: string, done: (err: unknown, user?: KeyPrincipal) => void) => {
        keys.authenticate(token, requestOrigin(req)).then(
          (principal) => done(null, principal),
          (err: unknown) => done(err),
        );
      },
    ),
  );
  return authenticator;
}

/** Runs the strategy; resolves to the principal or rejects with a 401/403 problem. */
export function authenticateKey(
  authenticator: passport.Authenticator,
  req: Parameters<RequestHandler>[0],
  res: Parameters<RequestHandler>[1],
): Promise<KeyPrincipal> {
  return new Promise((resolve, reject) => {
    const run = authenticator.authenticate(
      KEY_STRATEGY,
      { session: false },
      (err: unknown, principal: KeyPrincipal | false) => {
        if (err) reject(err);
        else if (principal) resolve(principal);
        else {
          reject(
            new ProblemError(
              401,
              'missing-key',
              'An API key is required',
              'Send the key as `Authorization: Bearer <key>`.',
              {},
              { 'WWW-Authenticate': 'Bearer realm="tropline"' },
            ),
          );
        }
      },
    ) as RequestHandler;
    void run(req, res, reject);
  });
}
