import type { RequestHandler } from 'express';
import { ProblemError } from '../http/problem';
import type { Scope } from '../keys/key-scopes';
import type { KeysService } from '../keys/keys-service';
import { authenticateKey, keyAuthenticator } from './bearer-strategy';
import { allowOrigin } from './key-cors';
import { setPrincipal } from './key-principal';
import { requestOrigin } from './request-origin';

/** Builds `requireKey(scope)` middlewares over one keys service. */
export type KeyGuard = (scope: Scope) => RequestHandler;

/**
 * Key middleware: authenticates the bearer key, checks the route's scope, and for browser
 * keys answers CORS for the (already checked) request origin. A browser page on a listed
 * origin can also read the problem when its key is refused.
 */
export function keyGuard(keys: KeysService, now: () => number): KeyGuard {
  const authenticator = keyAuthenticator(keys);
  return (scope) => async (req, res, next) => {
    const origin = requestOrigin(req);
    let principal;
    try {
      principal = await authenticateKey(authenticator, req, res);
    } catch (err) {
      if (origin && (await keys.repository.originIsListed(origin, new Date(now()).toISOString()))) {
        allowOrigin(res, origin);
      }
      throw err;
    }
    if (principal.kind === 'browser' && principal.origin) allowOrigin(res, principal.origin);
    if (!principal.scopes.includes(scope)) {
      throw new ProblemError(
        403,
        'insufficient-scope',
        'The key lacks a scope',
        principal.kind === 'browser'
          ? `Browser keys may only compute and read published scenarios; this needs "${scope}".`
          : `This route needs the "${scope}" scope; key ${principal.keyId} has ` +
              `${principal.scopes.join(', ') || 'none'}.`,
        { scope },
        {
          'WWW-Authenticate': `Bearer realm="tropline", error="insufficient_scope", scope="${scope}"`,
        },
      );
    }
    setPrincipal(req, principal);
    next();
  };
}
