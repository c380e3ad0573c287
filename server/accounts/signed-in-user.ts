import type { Request } from 'express';
import type { TenantRole } from '@tropline/core';
import type { MembershipRecord } from './users-repository';

/** The signed-in person as routes see them: read afresh from the database on every request. */
export interface SignedInUser {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly isOperator: boolean;
  readonly sessionGeneration: number;
  readonly memberships: readonly MembershipRecord[];
}

/** The tenant a console request acts in and the caller's role there. */
export interface TenantAccess {
  readonly tenantId: string;
  readonly tenantSlug: string;
  readonly tenantName: string;
  readonly role: TenantRole;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport's `req.user` is a signed-in Tropline user.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SignedInUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    /** Epoch ms (app clock) of the sign-in: the absolute lifetime counts from here. */
    signedInAt?: number;
    /** Epoch ms (app clock) of the last request: the idle timeout counts from here. */
    lastSeenAt?: number;
  }
}

/** The signed-in user; throws when a route forgot its guard. */
export function userOf(req: Request): SignedInUser {
  if (!req.user) throw new Error('route reached without a signed-in user');
  return req.user;
}

/** The tenant access the guard attached. */
export function accessOf(req: Request): TenantAccess {
  const access = (req as Request & { tenantAccess?: TenantAccess }).tenantAccess;
  if (!access) throw new Error('route reached without a tenant guard');
  return access;
}

/** Attaches the tenant access (the guard). */
export function setAccess(req: Request, access: TenantAccess): void {
  (req as Request & { tenantAccess?: TenantAccess }).tenantAccess = access;
}

/** The client address for throttling and the audit trail. */
export function clientAddress(req: Request): string {
  return (req.ip ?? req.socket.remoteAddress ?? 'unknown').slice(0, 64);
}
