import type { Request } from 'express';
import type { KeyKind } from '../keys/key-token';
import type { Scope } from '../keys/key-scopes';

/** Who is calling: the authenticated key, its tenant and the limits that apply to it. */
export interface KeyPrincipal {
  readonly keyId: string;
  readonly kind: KeyKind;
  readonly tenantId: string;
  readonly tenantSlug: string;
  readonly scopes: readonly Scope[];
  /** Whether the key may only read published scenarios (browser keys). */
  readonly publishedOnly: boolean;
  /** The request's Origin, for browser keys (already checked against the key's list). */
  readonly origin?: string;
  /** Compute units per calendar month for the tenant. */
  readonly monthlyUnits: number;
  /** Requests per minute for this key. */
  readonly perMinute: number;
}

/** The principal the key middleware attached; throws when a route forgot to require a key. */
export function principalOf(req: Request): KeyPrincipal {
  const principal = (req as Request & { principal?: KeyPrincipal }).principal;
  if (!principal) throw new Error('route reached without key authentication');
  return principal;
}

/** Attaches the principal to the request. */
export function setPrincipal(req: Request, principal: KeyPrincipal): void {
  (req as Request & { principal?: KeyPrincipal }).principal = principal;
}
