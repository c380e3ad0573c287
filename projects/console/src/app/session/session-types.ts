import type { TenantRole } from '@tropline/core';

/** One tenant the signed-in person belongs to, with their role there. */
export interface SessionTenant {
  readonly id: string;
  readonly slug: string;
  readonly name: string;
  readonly role: TenantRole;
}

/** The body of `GET /api/v1/session` and of a successful sign-in. */
export interface SessionView {
  readonly user: {
    readonly id: string;
    readonly email: string;
    readonly name: string;
    readonly operator: boolean;
  };
  readonly tenants: readonly SessionTenant[];
  readonly csrfToken: string;
  readonly expiresAt: string;
}

/** Where the console stands with the server: not asked yet, signed out, or signed in. */
export type SessionState =
  | { readonly kind: 'unknown' }
  | { readonly kind: 'signed-out'; readonly reason?: 'expired' | 'signed-out' }
  | { readonly kind: 'signed-in'; readonly session: SessionView };

/**
 * The tenant to act in: the remembered slug while the person still belongs to it, else their
 * first tenant, else none (someone who belongs to no tenant yet).
 */
export function chooseTenant(
  tenants: readonly SessionTenant[],
  remembered: string | null,
): SessionTenant | undefined {
  return tenants.find((t) => t.slug === remembered) ?? tenants[0];
}
