/** Scopes a server key may hold; each route names the one it needs. */
export const SERVER_SCOPES = [
  'compute',
  'scenarios:read',
  'scenarios:write',
  'usage:read',
  'keys:manage',
] as const;

/** One scope name. */
export type Scope = (typeof SERVER_SCOPES)[number];

/**
 * What a browser key may do, whatever it was issued with: compute, and read published
 * scenarios (the scenarios routes check `publishedOnly`). It is public by design.
 */
export const BROWSER_SCOPES: readonly Scope[] = ['compute', 'scenarios:read'];

/** Scopes a server key gets when none are given: everything but key management. */
export const DEFAULT_SERVER_SCOPES: readonly Scope[] = [
  'compute',
  'scenarios:read',
  'scenarios:write',
  'usage:read',
];

/** Whether a string names a scope. */
export function isScope(value: string): value is Scope {
  return (SERVER_SCOPES as readonly string[]).includes(value);
}
