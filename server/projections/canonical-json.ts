import { createHash } from 'node:crypto';

/**
 * JSON with object keys sorted at every depth, so two bodies that differ only in key order (or
 * in how a number was spelled: `1e3` and `1000`) give the same text.
 */
export function canonicalJson(value: unknown, maxDepth = Infinity): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (maxDepth <= 0) throw new RangeError('nested deeper than the canonical form allows');
  const inner = (v: unknown) => canonicalJson(v, maxDepth - 1);
  if (Array.isArray(value)) return `[${value.map(inner).join(',')}]`;
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${inner(obj[k])}`).join(',')}}`;
}

/** SHA-256 (hex) of the canonical JSON of a request, scoped to a tenant and an endpoint. */
export function requestHash(
  tenantId: string,
  endpoint: string,
  body: unknown,
  maxDepth = Infinity,
): string {
  return createHash('sha256')
    .update(`${tenantId}\u0000${endpoint}\u0000${canonicalJson(body, maxDepth)}`)
    .digest('hex');
}

/** Deeper than any valid request body (a chain model nests four levels). */
const UNVALIDATED_DEPTH = 16;

/**
 * {@link requestHash} of a body not yet validated, or undefined when it nests deeper than any
 * valid body could (so a hostile body cannot make the canonical form recurse without bound).
 */
export function unvalidatedRequestHash(tenantId: string, endpoint: string, body: unknown) {
  try {
    return requestHash(tenantId, endpoint, body, UNVALIDATED_DEPTH);
  } catch (err) {
    if (err instanceof RangeError) return undefined;
    throw err;
  }
}
