import type { Request, RequestHandler } from 'express';
import { can, type Action } from '@tropline/core';
import { ProblemError } from '../http/problem';
import { setAccess } from './signed-in-user';

/** Header naming the tenant (by slug) a console request acts in. */
export const TENANT_HEADER = 'tropline-tenant';

/** 401 for console routes: nobody is signed in (or the session just ended). */
export function notSignedIn(req: Request): ProblemError {
  const expired = (req as Request & { sessionExpired?: boolean }).sessionExpired === true;
  return new ProblemError(
    401,
    expired ? 'session-expired' : 'not-signed-in',
    expired ? 'Your session has expired' : 'Not signed in',
    expired
      ? 'Sessions end after two hours without activity or twelve hours after sign-in; sign in ' +
          'again.'
      : 'Sign in with POST /api/v1/session first.',
  );
}

/** Middleware: a signed-in user, whatever their role. */
export const requireSignIn: RequestHandler = (req, _res, next) => {
  if (!req.user) throw notSignedIn(req);
  next();
};

/**
 * Middleware for tenant routes: a signed-in member of the tenant named by the
 * `Tropline-Tenant` header (optional for someone in exactly one tenant) whose role allows
 * `action` by the role matrix. Someone outside the tenant gets the same 403 whether or not the
 * tenant exists.
 */
export function requireTenantAction(action: Action): RequestHandler {
  return (req, _res, next) => {
    const user = req.user;
    if (!user) throw notSignedIn(req);
    const slug = req.get(TENANT_HEADER)?.trim();
    const membership = slug
      ? user.memberships.find((m) => m.tenantSlug === slug)
      : user.memberships.length === 1
        ? user.memberships[0]
        : undefined;
    if (!slug && !membership) {
      throw new ProblemError(
        400,
        'tenant-required',
        'Which tenant?',
        user.memberships.length
          ? 'You belong to several tenants; name one in the Tropline-Tenant header.'
          : 'You belong to no tenant yet.',
        { errors: [{ pointer: '', message: 'send the Tropline-Tenant header (a tenant slug)' }] },
      );
    }
    if (!membership) {
      throw new ProblemError(
        403,
        'not-a-member',
        'Not a member of this tenant',
        `You have no role in the tenant "${slug}".`,
      );
    }
    if (!can(membership.role, action)) {
      throw new ProblemError(
        403,
        'role-forbidden',
        'Your role does not allow this',
        `As ${membership.role} of ${membership.tenantName} you may not do "${action}"; ask an ` +
          'owner or admin.',
        { action, role: membership.role },
      );
    }
    setAccess(req, {
      tenantId: membership.tenantId,
      tenantSlug: membership.tenantSlug,
      tenantName: membership.tenantName,
      role: membership.role,
    });
    next();
  };
}

/** Middleware for platform routes: the signed-in platform operator. */
export function requirePlatformAction(action: Action): RequestHandler {
  return (req, _res, next) => {
    const user = req.user;
    if (!user) throw notSignedIn(req);
    if (!user.isOperator || !can('operator', action)) {
      throw new ProblemError(
        403,
        'role-forbidden',
        'Your role does not allow this',
        `Only the platform operator may do "${action}".`,
        { action },
      );
    }
    next();
  };
}
