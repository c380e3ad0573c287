import { Router, type Request, type RequestHandler } from 'express';
import type { Action } from '@tropline/core';
import { requireTenantAction } from '../accounts/access-guard';
import type { SessionStack } from '../accounts/session-stack';
import { accessOf, clientAddress, userOf } from '../accounts/signed-in-user';
import { principalOf, type KeyPrincipal } from '../auth/key-principal';
import { keyGuard } from '../auth/require-key';
import { ProblemError } from '../http/problem';
import type { Scope } from '../keys/key-scopes';
import type { KeysService } from '../keys/keys-service';
import type { QuotasService } from '../quotas/quotas-service';

/** Who acts on a scenario route: a key or a signed-in member, always inside one tenant. */
export interface Actor {
  readonly tenantId: string;
  /** `key:<id>` or `user:<id>`, as the audit trail writes actors. */
  readonly actor: string;
  /** The key, when a key called (compute routes price their work against it). */
  readonly principal?: KeyPrincipal;
  /** The signed-in user's id, when a session called. */
  readonly userId?: string;
  /** The caller's address, for the audit trail. */
  readonly address?: string;
}

/** The actor the guard attached. */
export function actorOf(req: Request): Actor {
  const actor = (req as Request & { scenarioActor?: Actor }).scenarioActor;
  if (!actor) throw new Error('route reached without the scenario guard');
  return actor;
}

function setActor(req: Request, actor: Actor): void {
  (req as Request & { scenarioActor?: Actor }).scenarioActor = {
    ...actor,
    address: clientAddress(req),
  };
}

/** What a scenario route needs: the role-matrix action (sessions) and the scope (keys). */
export interface Need {
  readonly action: Action;
  readonly scope: Scope;
  /** Whether browser keys may call it (only the published-scenario routes). */
  readonly browser?: boolean;
}

/** Builds the guard of scenario routes. */
export type ScenarioGuard = (need: Need) => RequestHandler;

/**
 * Scenario routes take either credential: a bearer key with the route's scope (browser keys
 * only where the route serves published versions), or the console's cookie session with CSRF
 * on changes and the role matrix's action in the `Tropline-Tenant` tenant. The session stack
 * is the accounts routes' own, so both read the same sessions and CSRF tokens.
 */
export function scenarioGuard(
  stack: SessionStack,
  now: () => number,
  keyed: { readonly keys: KeysService; readonly quotas: QuotasService },
): ScenarioGuard {
  const requireKey = keyGuard(keyed.keys, now);
  const metered = keyed.quotas.free('scenarios');
  return (need) => {
    const byKey = Router();
    byKey.use(requireKey(need.scope), metered, (req, _res, next) => {
      const principal = principalOf(req);
      if (principal.publishedOnly && !need.browser) {
        throw new ProblemError(
          403,
          'insufficient-scope',
          'The key lacks a scope',
          'Browser keys may only compute and read published scenarios (/published-scenarios).',
          { scope: need.scope },
        );
      }
      setActor(req, { tenantId: principal.tenantId, actor: `key:${principal.keyId}`, principal });
      next();
    });
    const bySession = Router();
    bySession.use(
      ...stack.middleware,
      stack.originGuard,
      stack.csrfGuard,
      requireTenantAction(need.action),
      (req, _res, next) => {
        const user = userOf(req);
        setActor(req, {
          tenantId: accessOf(req).tenantId,
          actor: `user:${user.id}`,
          userId: user.id,
        });
        next();
      },
    );
    return (req, res, next) => {
      const bearer = /^bearer\s/i.test(req.headers.authorization ?? '');
      (bearer ? byKey : bySession)(req, res, next);
    };
  };
}
