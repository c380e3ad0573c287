import { createHash } from 'node:crypto';

/**
 * JSON with object keys sorted at every depth, so two bodies that differ only in key order (or
 * in how a number was spelled: `1e3` and `1000`) give the same text.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
}

/** SHA-256 (hex) of the canonical JSON of a request, scoped to a tenant and an endpoint. */
export function requestHash(tenantId: string, endpoint: string, body: unknown): string {
  return createHash('sha256')
    .update(`${tenantId}\u0000${endpoint}\u0000${canonicalJson(body)}`)
    .digest('hex');
}
