/** Header naming the tenant a console request acts in. */
export const TENANT_HEADER = 'Tropline-Tenant';

/** Header carrying the CSRF token on cookie-authenticated changes. */
export const CSRF_HEADER = 'X-CSRF-Token';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** What the console knows when it sends a request. */
export interface HeaderContext {
  readonly tenantSlug: string | undefined;
  readonly csrfToken: string | undefined;
}

/**
 * The headers the console adds to one of its API requests: the tenant (unless the caller named
 * one) and, on a change, the CSRF token. Requests elsewhere get nothing.
 */
export function consoleHeaders(
  method: string,
  url: string,
  present: (name: string) => boolean,
  ctx: HeaderContext,
): Record<string, string> {
  if (!url.startsWith('/api/v1/')) return {};
  const add: Record<string, string> = {};
  if (ctx.tenantSlug && !present(TENANT_HEADER)) add[TENANT_HEADER] = ctx.tenantSlug;
  if (ctx.csrfToken && !SAFE_METHODS.has(method.toUpperCase()) && !present(CSRF_HEADER)) {
    add[CSRF_HEADER] = ctx.csrfToken;
  }
  return add;
}
