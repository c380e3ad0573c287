import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { AuditRepository } from '../audit/audit-repository';
import { ProblemError, validationProblem, type FieldError } from '../http/problem';
import { requireTenantAction } from './access-guard';
import { accessOf } from './signed-in-user';
import { UsersRepository } from './users-repository';

/** Page size when none is asked for, and the largest allowed. */
export const AUDIT_PAGE = { default: 50, max: 200 };

function readQuery(req: Request) {
  const errors: FieldError[] = [];
  const q = req.query as Record<string, unknown>;
  const str = (name: string, max = 120): string | undefined => {
    const v = q[name];
    if (v === undefined) return undefined;
    if (typeof v !== 'string' || v.length > max) {
      errors.push({ pointer: `/${name}`, message: `${name} is one string of at most ${max}` });
      return undefined;
    }
    return v;
  };
  const int = (name: string, min: number, max: number): number | undefined => {
    const v = str(name, 20);
    if (v === undefined) return undefined;
    if (!/^\d+$/.test(v) || Number(v) < min || Number(v) > max) {
      errors.push({ pointer: `/${name}`, message: `${name} must be a whole number ${min}–${max}` });
      return undefined;
    }
    return Number(v);
  };
  const instant = (name: string): string | undefined => {
    const v = str(name, 40);
    if (v === undefined) return undefined;
    const t = Date.parse(v);
    if (!Number.isFinite(t)) {
      errors.push({ pointer: `/${name}`, message: `${name} must be an ISO instant` });
      return undefined;
    }
    return new Date(t).toISOString();
  };
  const action = str('action', 400);
  const query = {
    actions: action
      ? action
          .split(',')
          .map((a) => a.trim())
          .filter(Boolean)
      : undefined,
    actor: str('actor'),
    target: str('target'),
    from: instant('from'),
    to: instant('to'),
    before: int('before', 1, Number.MAX_SAFE_INTEGER),
    limit: int('limit', 1, AUDIT_PAGE.max) ?? AUDIT_PAGE.default,
  };
  if (errors.length) throw validationProblem(errors);
  return query;
}

/**
 * `/audit-events`: the tenant's trail for owners and admins, newest first, filtered and paged
 * by a `before` cursor. Read-only: every other method is refused, whatever the role.
 */
export function auditEventsRoutes(db: Knex): Router {
  const router = Router();
  const audit = new AuditRepository(db);
  const users = new UsersRepository(db);

  router.get('/audit-events', requireTenantAction('audit:read'), async (req, res) => {
    const query = readQuery(req);
    const { tenantId } = accessOf(req);
    const members = (await users.members(tenantId)).map((m) => `user:${m.userId}`);
    const events = await audit.search({ ...query, tenantId, memberActors: members });
    const last = events.at(-1);
    res.json({
      events,
      next: events.length === query.limit && last ? last.id : null,
    });
  });

  router.all(['/audit-events', '/audit-events/*rest'], (req, _res, next) => {
    if (req.method === 'GET' || req.method === 'HEAD') return next(); // an unknown path: 404
    throw new ProblemError(
      405,
      'method-not-allowed',
      'The audit trail cannot be changed',
      `${req.method} is not allowed here: audit events are written by the server and never ` +
        'edited or deleted.',
      {},
      { Allow: 'GET' },
    );
  });
  return router;
}
